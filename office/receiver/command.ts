// `freshet office` as one entry of the `freshet` dispatcher (office/cli).
import type { Command } from '../shared/io';
import { OFFICE_HELP, runOffice } from './cli';

/** The `office` subcommand: the receiver and its devices. */
export const officeCommand: Command = {
  name: 'office',
  summary: 'run the office receiver for phones\' bundles (PGlite or PostgreSQL); add, list and revoke devices',
  help: OFFICE_HELP + '\n',
  run: (args, io) => runOffice(args, io),
};
