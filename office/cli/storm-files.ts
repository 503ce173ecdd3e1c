// The separated series of each saved storm analysis of a site, as CSV: the readings of its window
// through the rating (one discharge per time: the logger wins, core's rule), separated again with the
// analysis's method and key points.
import {
  READING_SOURCE_CODES, SEPARATION_METHOD_KINDS, separateBaseflow, seriesFromReadings, stormToCsv, toLocalInput,
  type SeparationMethod,
} from '../../core/index';
import type { SiteData } from './site-data';
import type { OutputFile } from './write-files';

/** The storm CSV files of a site (`<stem>_storm_<start date>.csv`) and one sentence per analysis that could not be written. */
export function stormFiles(data: SiteData, stem: string): { files: OutputFile[]; skipped: string[] } {
  const files: OutputFile[] = [];
  const skipped: string[] = [];
  const { site } = data;
  const names = new Set<string>();
  for (const a of data.analyses) {
    const day = toLocalInput(a.from_ms, site.timeZone).slice(0, 10);
    const label = `the storm analysis of ${site.code} from ${day}`;
    if (!(SEPARATION_METHOD_KINDS as readonly string[]).includes(a.method.kind)) {
      skipped.push(`${label} uses a separation method this version does not know ("${a.method.kind}")`);
      continue;
    }
    const rows = data.readings.filter((r) => r.reading.time_ms >= a.from_ms && r.reading.time_ms <= a.to_ms);
    const made = seriesFromReadings({
      time_ms: rows.map((r) => r.reading.time_ms),
      discharge_m3s: rows.map((r) => r.discharge_m3s),
      source: rows.map((r) => READING_SOURCE_CODES[r.reading.source]),
      extrapolated: rows.map((r) => (r.extrapolated ? 1 : 0)),
    });
    if (made.kind !== 'ready') {
      skipped.push(`${label} has ${made.kind === 'empty' ? 'no readings in its window in this bundle' : 'readings with no rating in force'}`);
      continue;
    }
    try {
      // The stored method is the tagged object the Storm screen saved; separateBaseflow checks its parameters.
      const method = a.method as unknown as SeparationMethod;
      const baseflow_m3s = separateBaseflow(made.series, method, { points: a.points, area_km2: a.area_km2 });
      let name = `${stem}_storm_${day}.csv`;
      if (names.has(name)) name = `${stem}_storm_${day}_${a.id.slice(0, 8)}.csv`;
      names.add(name);
      files.push({ name, text: stormToCsv({ series: made.series, baseflow_m3s, method: a.method.kind }, { siteCode: site.code, timeZone: site.timeZone, units: site.displayUnits }) });
    } catch (err) {
      skipped.push(`${label} could not be separated again: ${(err as Error).message}`);
    }
  }
  return { files, skipped };
}
