// The separated series of each saved storm analysis of a site, as CSV: the stage record of its window
// (spot readings and logger values, core's join) through the rating (one discharge per time: the logger
// wins, core's rule), separated again with the analysis's method and key points.
import {
  SEPARATION_METHOD_KINDS, separateBaseflow, seriesFromReadings, stormToCsv, toLocalInput,
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
    const st = data.stage;
    const first = st.time_ms.findIndex((t) => t >= a.from_ms);
    const from = first < 0 ? st.time_ms.length : first;
    let to = from;
    while (to < st.time_ms.length && st.time_ms[to] <= a.to_ms) to++;
    const made = seriesFromReadings({
      time_ms: st.time_ms.subarray(from, to),
      discharge_m3s: st.discharge_m3s.subarray(from, to),
      source: st.source.subarray(from, to),
      extrapolated: st.extrapolated.subarray(from, to),
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
      if (!(err instanceof RangeError)) throw err;
      skipped.push(`${label} could not be separated again from the records held here (its key points or method settings do not fit the stage record of its window); its saved figures stay in the analysis record`);
    }
  }
  return { files, skipped };
}
