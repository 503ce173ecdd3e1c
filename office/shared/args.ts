// Argument parsing for the subcommands on Node's own util.parseArgs, with its errors turned into one
// plain line each.
import { parseArgs } from 'node:util';
import { CliError } from './io';

/** Options a subcommand accepts: strings (e.g. --out DIR) and flags (e.g. --help). */
export type OptionSpec = Record<string, { type: 'string' | 'boolean'; short?: string }>;

/** Parsed arguments: the values of the options given and the positional arguments, in order. */
export interface ParsedArgs {
  values: Record<string, string | boolean | undefined>;
  positionals: string[];
}

/** Parses args strictly against spec; an unknown option or a missing value is a CliError (exit 2). */
export function parseCommandArgs(command: string, args: readonly string[], spec: OptionSpec): ParsedArgs {
  try {
    const { values, positionals } = parseArgs({ args: [...args], options: spec, strict: true, allowPositionals: true });
    return { values: values as ParsedArgs['values'], positionals };
  } catch (err) {
    const text = err instanceof Error ? err.message.split('\n')[0] : String(err);
    // Node's messages name the option ("Unknown option '--x'"); keep them, drop any usage tail.
    throw new CliError(`freshet ${command}: ${text.replace(/\. To specify a positional argument.*$/, '')} (try freshet ${command} --help)`, 2);
  }
}

/** The positional arguments, refusing any count other than `count` with a plain usage line. */
export function expectPositionals(command: string, parsed: ParsedArgs, names: readonly string[]): string[] {
  if (parsed.positionals.length !== names.length) {
    const what = names.length === 0 ? 'no file names' : names.map((n) => `<${n}>`).join(' ');
    throw new CliError(
      `freshet ${command}: expected ${what}; got ${parsed.positionals.length === 0 ? 'none' : parsed.positionals.map((p) => JSON.stringify(p)).join(' ')} (try freshet ${command} --help)`,
      2,
    );
  }
  return parsed.positionals;
}
