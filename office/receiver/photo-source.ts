// Where `freshet photos` takes a site's photos from: the office's database (`--data <folder>` or
// `--database <url>`), the current version of the site and of each of its photo records that is not
// deleted, and the photo bytes the office holds.
import { fromSyncRecord, isUuid, type PhotoRecord, type SiteRecord, type SyncKind, type SyncRecord } from '../../core/index';
import type { ParsedArgs } from '../shared/args';
import { CliError } from '../shared/io';
import type { Database, Queryable } from './db';
import { currentRecordsNaming } from './current';
import { openOfficeDatabase, OfficeSetupError } from './open';

/** A site and its live photo records, oldest taken first. */
export interface SitePhotos {
  site: SiteRecord;
  photos: PhotoRecord[];
}

/** The office database named by --data or --database (exactly one), or a CliError saying what to give. */
export async function openSourceDatabase(command: string, parsed: ParsedArgs): Promise<Database> {
  const { data, database } = parsed.values;
  if (data === undefined && database === undefined) throw new CliError(`freshet ${command}: say where the office keeps its records: --data <folder> or --database <url> (try freshet ${command} --help)`, 2);
  if (data !== undefined && database !== undefined) throw new CliError(`freshet ${command}: give --data or --database, not both`, 2);
  try {
    return await openOfficeDatabase(typeof database === 'string' ? { database } : { data: String(data) });
  } catch (err) {
    if (err instanceof OfficeSetupError) throw new CliError(`freshet ${command}: ${err.message}`);
    throw err;
  }
}

type Row<K extends SyncKind> = { id: string; rev: string; body: SyncRecord<K>['body'] };

/** The site with office code or id `site` and its photos; a CliError when there is no such site or the code is not unique. */
export async function sitePhotosFromDatabase(command: string, db: Queryable, site: string): Promise<SitePhotos> {
  const sites = await db.query<Row<'site'>>(
    `select id::text as id, rev, body from current_records
      where kind = 'site' and not deleted and (body ->> 'code' = $1 or ($2::boolean and id::text = $1))
      order by id`,
    [site, isUuid(site)],
  );
  if (sites.length === 0) throw new CliError(`freshet ${command}: the office database has no site with code or id ${JSON.stringify(site)}`);
  if (sites.length > 1) {
    throw new CliError(`freshet ${command}: ${sites.length} sites have the code ${JSON.stringify(site)}; give the site's id instead (${sites.map((s) => s.id).join(', ')})`);
  }
  const photos = (await currentRecordsNaming<SyncRecord<'photo'>['body']>(db, [sites[0].id], 'photo'))
    .sort((a, b) => a.body.taken_ms - b.body.taken_ms || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return {
    site: fromSyncRecord<'site'>({ kind: 'site', ...sites[0] }),
    photos: photos.map((p) => fromSyncRecord<'photo'>({ kind: 'photo', id: p.id, rev: p.rev, body: p.body })),
  };
}
