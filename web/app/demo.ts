// Loads the invented demo site into storage. Safe to run twice: the site, rating and gaugings have
// fixed ids and the readings are skipped as duplicates, so nothing is doubled.
import { demoScenario, DEMO_SITE_ID } from '../../core';
import { getSite, importReadings, saveGauging, saveRating, saveSite, type ImportProgress } from '../db';

/** Whether the demo site is on this phone (and not deleted). */
export async function hasDemoSite(): Promise<boolean> {
  return !!(await getSite(DEMO_SITE_ID));
}

/**
 * Writes the demo scenario, ending now. The site is written last, so a load cut short is completed by
 * the next tap instead of being taken for done. Resolves with the demo site's id.
 */
export async function loadDemoSite(onProgress?: (p: ImportProgress) => void): Promise<string> {
  if (await hasDemoSite()) return DEMO_SITE_ID;
  const s = demoScenario(Date.now());
  await importReadings(s.readings.map(({ id: _id, ...body }) => body), { onProgress });
  for (const g of s.gaugings) await saveGauging(g);
  await saveRating(s.rating);
  await saveSite(s.site);
  return DEMO_SITE_ID;
}
