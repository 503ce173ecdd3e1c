// The `freshet` command for office scripts: a dispatcher of subcommands. Each subcommand is one entry
// of COMMANDS (office/cli/commands/*); `freshet <name> --help` shows its own help.
import { checkCommand } from './commands/check';
import { csvCommand } from './commands/csv';
import { demoCommand } from './commands/demo';
import { photosCommand } from './commands/photos';
import { watermlCommand } from './commands/waterml';
import { CliError, processIo, type CliIo, type Command } from '../shared/io';
import { officeCommand } from '../receiver/command';

/** Every subcommand, in the order `freshet --help` lists them. */
export const COMMANDS: readonly Command[] = [demoCommand, checkCommand, watermlCommand, csvCommand, photosCommand, officeCommand];

/** The top-level help: what the command is and its subcommands. */
export function topHelp(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    'freshet: office tools for Freshet data (bundles, WaterML 2.0, CSV).',
    '',
    'Usage: freshet <command> [options]',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    '',
    'Run "freshet <command> --help" for the options of one command.',
    '',
  ].join('\n');
}

/** Runs `freshet` with argv (the words after the command's name); resolves with the exit status. */
export async function run(argv: readonly string[], io: CliIo = processIo()): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    (name === undefined ? io.stderr : io.stdout)(topHelp());
    return name === undefined ? 2 : 0;
  }
  const command = COMMANDS.find((c) => c.name === name);
  if (!command) {
    io.stderr(`freshet: unknown command "${name}"; use one of ${COMMANDS.map((c) => c.name).join(', ')} (try freshet --help)\n`);
    return 2;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(command.help);
    return 0;
  }
  try {
    return await command.run(rest, io);
  } catch (err) {
    if (err instanceof CliError) {
      io.stderr(`${err.message}\n`);
      return err.exitCode;
    }
    // An unexpected failure still ends with one line, not a stack trace.
    const text = err instanceof Error ? err.message : String(err);
    io.stderr(`freshet ${name}: failed: ${text.split('\n')[0]}\n`);
    return 1;
  }
}
