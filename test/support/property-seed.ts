// The seed of every property test (fast-check) in one run, chosen once by the global setup and handed to
// each test file: fixed in CI (CI=true), so a red CI run is repeated exactly; a fresh one elsewhere, so
// local runs keep exploring. FC_SEED=<n> repeats any run. The seed is printed at the start of the run,
// and fast-check prints it again with any counterexample.
import type { TestProject } from 'vitest/node';

/** The seed CI uses (any fixed integer; this one is the start of the invented test histories, 2026-05-01). */
export const CI_SEED = 20260501;

declare module 'vitest' {
  export interface ProvidedContext {
    propertySeed: number;
  }
}

/** The seed for this run: FC_SEED when given, CI_SEED in CI, else a fresh one. */
export function chooseSeed(env: NodeJS.ProcessEnv): number {
  if (env.FC_SEED !== undefined && env.FC_SEED !== '') {
    const n = Number(env.FC_SEED);
    if (!Number.isInteger(n)) throw new RangeError(`FC_SEED must be an integer; got "${env.FC_SEED}"`);
    return n;
  }
  if (env.CI === 'true' || env.CI === '1') return CI_SEED;
  return (Date.now() ^ (Math.random() * 0x7fffffff)) | 0;
}

/** Vitest global setup: picks the seed, prints it, and provides it to every test file. */
export default function setup(project: TestProject): void {
  const seed = chooseSeed(process.env);
  const why = process.env.FC_SEED ? 'from FC_SEED' : process.env.CI === 'true' || process.env.CI === '1' ? 'fixed in CI' : 'fresh';
  console.log(`Property tests (fast-check) seed ${seed} (${why}); repeat with FC_SEED=${seed}`);
  project.provide('propertySeed', seed);
}
