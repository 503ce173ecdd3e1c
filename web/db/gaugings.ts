// Gaugings: discharge measurements.
import type { GaugingRecord } from '../../core/records/index';
import { getIn, listRange, saveIn, tombstoneIn, type ReadOptions, type SaveInput, type SaveOptions } from './records';

/** Validates and saves a gauging (new id when absent), removing `draftId`'s draft in the same transaction; resolves once durable. */
export const saveGauging = (gauging: SaveInput<GaugingRecord>, options?: SaveOptions): Promise<GaugingRecord> => saveIn('gaugings', gauging, options);
/** The gauging with this id, or undefined (tombstones only with includeDeleted). */
export const getGauging = (id: string, options?: ReadOptions): Promise<GaugingRecord | undefined> => getIn('gaugings', id, options);
/** Deletes a gauging by tombstone; returns the tombstone. */
export const deleteGauging = (id: string): Promise<GaugingRecord | undefined> => tombstoneIn('gaugings', id);

/** Gaugings of a site with from_ms ≤ time_ms ≤ to_ms (UTC ms; whole history by default), oldest first. */
export function listGaugings(siteId: string, from_ms = -Infinity, to_ms = Infinity, options?: ReadOptions): Promise<GaugingRecord[]> {
  return listRange('gaugings', 'by-site-time', [siteId, from_ms], [siteId, to_ms], options);
}
