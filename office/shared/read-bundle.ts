// Reads a bundle file for a subcommand: the file, its JSON, then core's bundle checks (and the checks of the
// photo bytes it may carry), each failure as one plain line.
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { BundleBlobError, BundleError, bundleFileParts, bundleJson, type BlobBytes, type Bundle } from '../../core/exchange/index';
import { CliError } from './io';

/** The checked bundle in file `path` (relative to cwd), or a CliError (exit 1) saying what is wrong with it. */
export async function readBundleFile(command: string, path: string, cwd: string): Promise<Bundle> {
  return (await readBundleFileParts(command, path, cwd)).bundle;
}

/**
 * The checked bundle in file `path` and the photo bytes it carries (each checked by its hash, type and
 * size; keys the hex SHA-256), or a CliError (exit 1) saying what is wrong with the file.
 */
export async function readBundleFileParts(command: string, path: string, cwd: string): Promise<{ bundle: Bundle; blobs: Map<string, BlobBytes> }> {
  const full = resolve(cwd, path);
  let text: string;
  try {
    text = await readFile(full, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder, not a file' : code === 'EACCES' ? 'permission denied' : (err as Error).message.split('\n')[0];
    throw new CliError(`freshet ${command}: cannot read ${path}: ${why}`);
  }
  let json: unknown;
  try {
    json = bundleJson(text);
  } catch (err) {
    throw new CliError(`freshet ${command}: ${path} is not a bundle: it is not valid JSON (${(err as Error).message.split('\n')[0]})`);
  }
  try {
    return bundleFileParts(json);
  } catch (err) {
    if (err instanceof BundleError || err instanceof BundleBlobError) throw new CliError(`freshet ${command}: ${path}: ${err.message}`);
    throw err;
  }
}
