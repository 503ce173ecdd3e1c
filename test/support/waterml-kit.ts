// The OGC WaterML 2.0 validation kit (offline XML Schema validation with xmllint), found beside the
// repository as ../shared/standards/waterml2/validate (as CI lays it out); in a git worktree, beside the
// main checkout it belongs to.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const KIT = join('shared', 'standards', 'waterml2', 'validate');

/** The repository's root folder (two levels above this file). */
export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** Path of the kit's `validate` script; throws (failing the test) with where it looked when it is missing. */
export function watermlKit(): string {
  const tried = [resolve(REPO_ROOT, '..', KIT)];
  const common = spawnSync('git', ['rev-parse', '--path-format=absolute', '--git-common-dir'], { cwd: REPO_ROOT, encoding: 'utf8' });
  if (common.status === 0) tried.push(resolve(dirname(common.stdout.trim()), '..', KIT));
  const found = tried.find((p) => existsSync(p));
  if (!found) throw new Error(`The WaterML 2.0 validation kit is missing; looked for ${tried.join(' and ')}`);
  return found;
}

/** Runs the kit on files: its exit status (0 all valid) and its one line per file. */
export function validateWaterml(files: readonly string[]): { status: number | null; output: string } {
  const r = spawnSync(watermlKit(), [...files], { encoding: 'utf8' });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}
