// Reading stage readings: get, list by site and time window, latest per site, the one before a time.
// Every write goes through readings-write.ts.
import type { ReadingRecord } from '../../core/records/index';
import type { IDBPIndex } from 'idb';
import { withDb } from './connection';
import type { FreshetDB } from './schema';
import { getIn, listRange, type ReadOptions } from './records';

/** The reading with this id, or undefined (tombstones only with includeDeleted). */
export const getReading = (id: string, options?: ReadOptions): Promise<ReadingRecord | undefined> => getIn('readings', id, options);

/** Readings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms), oldest first. */
export function listReadings(siteId: string, from_ms: number, to_ms: number, options?: ReadOptions): Promise<ReadingRecord[]> {
  return listRange('readings', 'by-site-time', [siteId, from_ms], [siteId, to_ms], options);
}

/** The most recent reading of a site that is not deleted, or undefined. */
export async function latestReading(siteId: string): Promise<ReadingRecord | undefined> {
  return (await latestReadings([siteId])).get(siteId);
}

/** The most recent non-deleted reading of each given site, in one read transaction (for the sites list). */
export function latestReadings(siteIds: readonly string[]): Promise<Map<string, ReadingRecord>> {
  return withDb(async (db) => {
    const index = db.transaction('readings').store.index('by-site-time');
    const found = await Promise.all(siteIds.map((siteId) => lastBefore(index, siteId, Infinity)));
    const out = new Map<string, ReadingRecord>();
    found.forEach((r, i) => r && out.set(siteIds[i], r));
    return out;
  });
}

/**
 * The site's last non-deleted reading strictly before before_ms (UTC ms), skipping the reading exceptId
 * (the one being edited): what a new reading's jump is measured from. One cursor step, not a window read.
 */
export function readingBefore(siteId: string, before_ms: number, exceptId?: string): Promise<ReadingRecord | undefined> {
  return withDb((db) => lastBefore(db.transaction('readings').store.index('by-site-time'), siteId, before_ms, exceptId));
}

type SiteTimeIndex = IDBPIndex<FreshetDB, ['readings'], 'readings', 'by-site-time'>;

async function lastBefore(index: SiteTimeIndex, siteId: string, before_ms: number, exceptId?: string): Promise<ReadingRecord | undefined> {
  let cursor = await index.openCursor(IDBKeyRange.bound([siteId, -Infinity], [siteId, before_ms], false, true), 'prev');
  while (cursor && (cursor.value.deleted || cursor.value.id === exceptId)) cursor = await cursor.continue();
  return cursor?.value;
}
