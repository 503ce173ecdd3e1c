// Sites: the gauging stations a technician visits.
import type { SiteRecord } from '../../core/records/index';
import { getIn, listAll, restoreIn, saveIn, tombstoneIn, type ReadOptions, type SaveInput } from './records';

/** Validates and saves a site (new id when absent); resolves with the stored record once it is durable. */
export const saveSite = (site: SaveInput<SiteRecord>): Promise<SiteRecord> => saveIn('sites', site);
/** The site with this id, or undefined (tombstones only with includeDeleted). */
export const getSite = (id: string, options?: ReadOptions): Promise<SiteRecord | undefined> => getIn('sites', id, options);
/** Deletes a site by tombstone; returns the tombstone (undo with restoreSite), or undefined if already deleted. */
export const deleteSite = (id: string): Promise<SiteRecord | undefined> => tombstoneIn('sites', id);
/** Undoes deleteSite under a new revision. */
export const restoreSite = (id: string): Promise<SiteRecord | undefined> => restoreIn('sites', id);

/** Every site, sorted by code (tombstones only with includeDeleted). */
export async function listSites(options?: ReadOptions): Promise<SiteRecord[]> {
  const sites = await listAll('sites', options);
  return sites.sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
}
