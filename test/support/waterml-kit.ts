// The OGC WaterML 2.0 validation kit (offline XML Schema validation with xmllint), carried in the
// repository at test/fixtures/waterml2 (schemas and licence notice there), so a fresh clone needs nothing
// beside it. `npm test` installs xmllint when it is missing (scripts/find-xmllint.mjs).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository's root folder (two levels above this file). */
export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');

/** The kit's folder inside the repository. */
export const WATERML_KIT_DIR = join(REPO_ROOT, 'test', 'fixtures', 'waterml2');

/** Path of the kit's `validate` script; throws (failing the test) when the in-repo copy is missing. */
export function watermlKit(): string {
  const script = join(WATERML_KIT_DIR, 'validate');
  if (!existsSync(script)) throw new Error(`The WaterML 2.0 validation kit is missing from the repository; expected ${script}`);
  return script;
}

/** Runs the kit on files: its exit status (0 all valid) and its one line per file. */
export function validateWaterml(files: readonly string[]): { status: number | null; output: string } {
  const r = spawnSync(watermlKit(), [...files], { encoding: 'utf8' });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}
