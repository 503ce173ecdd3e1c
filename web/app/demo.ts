// Loads the invented demo site into storage. Safe to run twice: the site, rating and gaugings have
// fixed ids, the check readings are skipped as duplicates and the logger record is stored as logger days
// (one record per UTC day, as a real logger import stores it) whose times already held are not doubled.
import { demoLoggerRecord, demoScenario, DEMO_SITE_ID } from '../../core';
import { getSite, importLoggerRecord, importReadings, saveGauging, saveRating, saveSite, type ImportProgress } from '../db';

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
  const logger = demoLoggerRecord(s);
  const first = s.loggerDays[0];
  await importLoggerRecord({ siteId: DEMO_SITE_ID, fileName: first.fileName, note: first.note, checks: first.checks, ...logger });
  for (const g of s.gaugings) await saveGauging(g);
  await saveRating(s.rating);
  await saveSite(s.site);
  return DEMO_SITE_ID;
}
