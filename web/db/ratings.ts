// Ratings: each in force from its validFrom_ms until the next one of the same site.
import { ratingInForce } from '../../core/rating/index';
import type { GaugingRecord, RatingRecord } from '../../core/records/index';
import { withDb } from './connection';
import { SCOPES } from './stores';
import { listRange, restoreIn, saveIn, tombstoneIn, type ReadOptions, type SaveInput } from './records';

/** Validates and saves a rating (new id when absent); resolves with the stored record once it is durable. */
export const saveRating = (rating: SaveInput<RatingRecord>): Promise<RatingRecord> => saveIn('ratings', rating);
/** Deletes a rating by tombstone; returns the tombstone (undo with restoreRating). */
export const deleteRating = (id: string): Promise<RatingRecord | undefined> => tombstoneIn('ratings', id);
/** Undoes deleteRating under a new revision. */
export const restoreRating = (id: string): Promise<RatingRecord | undefined> => restoreIn('ratings', id);

/** Every rating of a site, oldest validFrom_ms first: the rating history. */
export function listRatings(siteId: string, options?: ReadOptions): Promise<RatingRecord[]> {
  return listRange('ratings', 'by-site-from', [siteId, -Infinity], [siteId, Infinity], options);
}

/** The rating in force at a site at time_ms (UTC ms), as core's ratingInForce picks it, or undefined. */
export async function ratingInForceAt(siteId: string, time_ms: number): Promise<RatingRecord | undefined> {
  return ratingInForce(await listRange('ratings', 'by-site-from', [siteId, -Infinity], [siteId, time_ms]), time_ms);
}

/** A site's ratings (oldest validFrom_ms first) and gaugings (oldest first), read in one transaction; no tombstones. */
export function ratingsAndGaugings(siteId: string): Promise<{ ratings: RatingRecord[]; gaugings: GaugingRecord[] }> {
  return withDb(async (db) => {
    const tx = db.transaction(SCOPES.ratingsGaugings);
    const [ratings, gaugings] = await Promise.all([
      tx.objectStore('ratings').index('by-site-from').getAll(IDBKeyRange.bound([siteId, -Infinity], [siteId, Infinity])),
      tx.objectStore('gaugings').index('by-site-time').getAll(IDBKeyRange.bound([siteId, -Infinity], [siteId, Infinity])),
    ]);
    return { ratings: ratings.filter((r) => !r.deleted), gaugings: gaugings.filter((g) => !g.deleted) };
  });
}
