// The `freshet` command run through its dispatcher in this process (no child), as the office tests use it.
import { run } from '../../../office/cli/index';

/** Runs `freshet <args>` in `cwd` (default: this process's); resolves to the exit status and what it wrote. */
export async function freshet(args: readonly string[], cwd = process.cwd()): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await run(args, { stdout: (s) => (out += s), stderr: (s) => (err += s), cwd });
  return { code, out, err };
}
