// Writes a set of files into an output folder all at once: into a fresh temporary folder beside it
// first, then renamed into place, so a failure part-way leaves nothing half-written.
import { randomBytes } from 'node:crypto';
import { mkdir, readdir, rename, rm, rmdir, stat, writeFile } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import { CliError } from '../shared/io';

/** One file to write: its name inside the output folder (no slashes) and its text (UTF-8). */
export interface OutputFile {
  name: string;
  text: string;
}

/** A file of bytes to write: its name and a function giving its bytes (called as it is written, so large files are held one at a time). */
export interface BytesOutputFile {
  name: string;
  bytes: () => Promise<Uint8Array>;
}

async function statOrNull(path: string) {
  try {
    return await stat(path);
  } catch {
    return null;
  }
}

/**
 * Writes files into outDir (created; it may exist only as an empty folder). Resolves with the folder's
 * full path (missing folders above it are made). Throws a CliError, writing nothing, when the folder holds files.
 */
export async function writeFilesAtomically(command: string, outDir: string, files: readonly (OutputFile | BytesOutputFile)[], cwd: string): Promise<string> {
  const target = resolve(cwd, outDir);
  const parent = dirname(target);
  const names = new Set<string>();
  for (const f of files) {
    if (!/^[^/\\]+$/.test(f.name) || f.name === '.' || f.name === '..' || names.has(f.name)) {
      throw new CliError(`freshet ${command}: cannot write a file named ${JSON.stringify(f.name)}`);
    }
    names.add(f.name);
  }
  // Missing folders above the output folder are made (as `mkdir -p` would); a file in the way is refused.
  try {
    await mkdir(parent, { recursive: true });
  } catch (err) {
    throw new CliError(`freshet ${command}: cannot make the folder ${parent}: ${(err as Error).message.split('\n')[0]}`);
  }
  const parentStat = await statOrNull(parent);
  if (!parentStat?.isDirectory()) throw new CliError(`freshet ${command}: ${parent} is not a folder; give another --out`);
  const existing = await statOrNull(target);
  if (existing && !existing.isDirectory()) throw new CliError(`freshet ${command}: ${target} is a file; --out needs a new or empty folder`);
  if (existing && (await readdir(target)).length > 0) {
    throw new CliError(`freshet ${command}: ${target} already holds files; give a new or empty folder as --out`);
  }
  let temp: string;
  try {
    // mkdir (not mkdtemp, which always makes 0700) so the folder's permissions follow the umask, as the
    // files' do; the random name keeps two runs apart.
    temp = join(parent, `.${basename(target)}.partial-${randomBytes(6).toString('hex')}`);
    await mkdir(temp);
  } catch (err) {
    throw new CliError(`freshet ${command}: cannot write in ${parent}: ${(err as Error).message.split('\n')[0]}`);
  }
  try {
    for (const f of files) {
      if ('text' in f) await writeFile(join(temp, f.name), f.text, { encoding: 'utf8', flag: 'wx' });
      else await writeFile(join(temp, f.name), await f.bytes(), { flag: 'wx' });
    }
    if (existing) await rmdir(target);
    await rename(temp, target);
  } catch (err) {
    await rm(temp, { recursive: true, force: true });
    throw new CliError(`freshet ${command}: could not write ${target}: ${(err as Error).message.split('\n')[0]}`);
  }
  return target;
}
