// Where an export command (`freshet csv`, `freshet waterml`) takes its records from: a bundle file, or the
// office's database (`--data <folder>` or `--database <url>` with `--site <code>`): the current version of
// the site and of every record of it, as the merge rules left them.
import type { SyncRecord } from '../../core/index';
import { expectPositionals, type OptionSpec, type ParsedArgs } from '../shared/args';
import { CliError, type CliIo } from '../shared/io';
import { readBundleFile } from '../shared/read-bundle';
import type { Queryable } from './db';
import { currentRecordsNaming, type CurrentRow } from './current';
import { openOfficeDatabase, OfficeSetupError } from './open';

/** The options an export command adds to read from the office's database. */
export const DATABASE_SOURCE_OPTIONS: OptionSpec = {
  data: { type: 'string' },
  database: { type: 'string' },
  site: { type: 'string' },
};

/** The help lines for those options. */
export const DATABASE_SOURCE_HELP = `  --data DIR       read the office receiver's embedded database in DIR instead of a bundle file
  --database URL   read the office receiver's PostgreSQL database instead of a bundle file
  --site CODE      with --data or --database: the site to export (its office code)`;

/** The current, not deleted, versions of the sites with office code `code` and of every record that names them. */
export async function siteRecordsFromDatabase(db: Queryable, code: string): Promise<SyncRecord[]> {
  const sites = await db.query<CurrentRow<SyncRecord['body']>>(
    `select kind, id::text as id, rev, body from current_records where kind = 'site' and not deleted and body ->> 'code' = $1`,
    [code],
  );
  const named = await currentRecordsNaming<SyncRecord['body']>(db, sites.map((s) => s.id), null);
  const rows = [...sites, ...named.filter((r) => r.kind !== 'site')].sort(byKindThenId);
  return rows.map((r) => ({ kind: r.kind, id: r.id, rev: r.rev, body: r.body }) as SyncRecord);
}

// Kind, then id: the order the records were always listed in (both are plain ASCII, so code-unit order).
function byKindThenId(a: CurrentRow, b: CurrentRow): number {
  return a.kind < b.kind ? -1 : a.kind > b.kind ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** The records an export command works on: from the bundle file named in its arguments, or from the office's database. */
export async function exportRecords(command: string, parsed: ParsedArgs, io: CliIo): Promise<SyncRecord[]> {
  const { data, database, site } = parsed.values;
  if (data === undefined && database === undefined) {
    if (site !== undefined) throw new CliError(`freshet ${command}: --site needs --data <folder> or --database <url> (a bundle file holds its own sites)`, 2);
    const [path] = expectPositionals(command, parsed, ['bundle.json']);
    return (await readBundleFile(command, path, io.cwd)).records;
  }
  expectPositionals(command, parsed, []);
  if (typeof site !== 'string' || site === '') throw new CliError(`freshet ${command}: --site <code> is required with --data or --database (try freshet ${command} --help)`, 2);
  if (data !== undefined && database !== undefined) throw new CliError(`freshet ${command}: give --data or --database, not both`, 2);
  let db;
  try {
    db = await openOfficeDatabase(typeof database === 'string' ? { database } : { data: String(data) });
  } catch (err) {
    if (err instanceof OfficeSetupError) throw new CliError(`freshet ${command}: ${err.message}`);
    throw err;
  }
  try {
    const records = await siteRecordsFromDatabase(db, site);
    if (!records.some((r) => r.kind === 'site')) throw new CliError(`freshet ${command}: the office database has no site with code ${JSON.stringify(site)}`);
    return records;
  } finally {
    await db.close();
  }
}
