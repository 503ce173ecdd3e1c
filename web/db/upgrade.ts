// The cumulative upgrade ladder. Never edit a released step: add `if (oldVersion < N)` below it, and a
// test that opens a database written by version N − 1 and finds every record intact.
import type { IDBPDatabase, IDBPTransaction, StoreNames } from 'idb';
import { DB_VERSION, type FreshetDB } from './schema';

/**
 * Brings a database from oldVersion (0 when new) up to `target` (DB_VERSION; tests pass an older
 * version to build the database an earlier release wrote) inside the versionchange transaction.
 */
export function upgradeFreshetDb(
  db: IDBPDatabase<FreshetDB>,
  oldVersion: number,
  _tx: IDBPTransaction<FreshetDB, StoreNames<FreshetDB>[], 'versionchange'>,
  target: number = DB_VERSION,
): void {
  if (oldVersion < 1 && target >= 1) {
    const sites = db.createObjectStore('sites', { keyPath: 'id' });
    sites.createIndex('by-code', 'code');
    sites.createIndex('by-rev', 'rev');
    const readings = db.createObjectStore('readings', { keyPath: 'id' });
    readings.createIndex('by-site-time', ['siteId', 'time_ms']);
    readings.createIndex('by-site-source-time', ['siteId', 'source', 'time_ms']);
    readings.createIndex('by-rev', 'rev');
    const gaugings = db.createObjectStore('gaugings', { keyPath: 'id' });
    gaugings.createIndex('by-site-time', ['siteId', 'time_ms']);
    gaugings.createIndex('by-rev', 'rev');
    const ratings = db.createObjectStore('ratings', { keyPath: 'id' });
    ratings.createIndex('by-site-from', ['siteId', 'validFrom_ms']);
    ratings.createIndex('by-rev', 'rev');
    const analyses = db.createObjectStore('analyses', { keyPath: 'id' });
    analyses.createIndex('by-site-from', ['siteId', 'from_ms']);
    analyses.createIndex('by-rev', 'rev');
    db.createObjectStore('drafts', { keyPath: 'id' }).createIndex('by-form', 'form');
    db.createObjectStore('conflicts', { keyPath: 'id' }).createIndex('by-record', 'recordId');
    db.createObjectStore('meta');
    // Derived from readings (local only, never synced): one chunk of arrays per site and UTC day.
    db.createObjectStore('series', { keyPath: ['siteId', 'day'] });
  }
  if (oldVersion < 2 && target >= 2) {
    // Sync (local only): settings, marks, cursor and status; and the bundles waiting for the office.
    db.createObjectStore('sync');
    db.createObjectStore('outbox', { keyPath: 'id' }).createIndex('by-created', 'created_ms');
  }
  if (oldVersion < 3 && target >= 3) {
    // Logger records as one record per site and UTC day (logger-days.ts). Not a unique index: the ids are
    // derived from site and day, but a record synced from elsewhere must never make a merge fail.
    const loggerDays = db.createObjectStore('loggerDays', { keyPath: 'id' });
    loggerDays.createIndex('by-site-day', ['siteId', 'day']);
    loggerDays.createIndex('by-rev', 'rev');
  }
  if (oldVersion < 4 && target >= 4) {
    // Photos (issue 25): the records, which sync, and their bytes by SHA-256, which stay on the phone.
    const photos = db.createObjectStore('photos', { keyPath: 'id' });
    photos.createIndex('by-owner', 'owner.id');
    photos.createIndex('by-site-taken', ['siteId', 'taken_ms']);
    photos.createIndex('by-sha256', 'sha256');
    photos.createIndex('by-rev', 'rev');
    db.createObjectStore('photoBytes', { keyPath: 'sha256' });
  }
}
