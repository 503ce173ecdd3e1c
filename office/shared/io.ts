// What a subcommand may touch: its output streams and the working folder (tests pass their own); a
// refusal with its exit status; the shape of a subcommand. Shared by office/cli and office/receiver.

/** Where a subcommand writes: stdout for results, stderr for messages; cwd resolves relative paths. */
export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  cwd: string;
}

/** A refusal with a one-line message for the user and the exit status to end with (2 usage, 1 bad input). */
export class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode: 1 | 2 = 1,
  ) {
    super(message);
    this.name = 'CliError';
  }
}

/** One `freshet` subcommand: its name, a one-line summary, its --help text, and what it does. */
export interface Command {
  name: string;
  summary: string;
  help: string;
  /** Runs with the arguments after the subcommand's name; resolves with the exit status. */
  run(args: readonly string[], io: CliIo): Promise<number>;
}

/** The process's own streams and folder. */
export function processIo(): CliIo {
  return {
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
    cwd: process.cwd(),
  };
}
