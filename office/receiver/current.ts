// Reading the office's current records (the view current_records, migration 4: each record's version with
// the highest revision) by site, through the versions' site index. The view itself is right for reads by
// kind and id; a read by site filters on the body, which the view cannot take below its choice of the
// latest version, so it would choose the latest version of every record first. Here the records that ever
// named a site are found by the index, each one's latest version is then read by its key, and only those
// that still name the site (and are not deleted) are kept.
import type { Queryable } from './db';

/** One current record as read: kind, id (text), revision and body. */
export interface CurrentRow<B = unknown> {
  kind: string;
  id: string;
  rev: string;
  body: B;
}

/**
 * The current, not deleted, records of kind `kind` (every kind when null) whose body names one of the
 * sites `siteIds` (`siteId`), in kind then id order.
 */
export async function currentRecordsNaming<B = unknown>(db: Queryable, siteIds: readonly string[], kind: string | null): Promise<CurrentRow<B>[]> {
  if (siteIds.length === 0) return [];
  return db.query<CurrentRow<B>>(
    `with named as (
       select distinct kind, id from record_versions
        where body ->> 'siteId' = any($1::text[]) and ($2::text is null or kind = $2::text))
     select c.kind, c.id::text as id, c.rev, c.body
       from named n cross join lateral (
         select v.kind, v.id, v.rev, v.deleted, v.body from record_versions v
          where v.kind = n.kind and v.id = n.id
          order by v.rev collate "C" desc limit 1) c
      where not c.deleted and c.body ->> 'siteId' = any($1::text[])
      order by c.kind, c.id`,
    [siteIds, kind],
  );
}
