// A storm's separated series as a CSV table: per time, the discharge, the baseflow under it and the
// direct runoff (their difference), with the separation method named in a column.
import { displayUnit, toDisplay } from '../units';
import { isoWithOffsetFormatter } from './iso-times';
import type { Series } from '../hydrograph/index';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';
import type { SiteCsvOptions } from './gaugings-csv';

/** A separated storm: the series (UTC ms, m³/s), the baseflow at the same times (m³/s) and the method's plain name. */
export interface SeparatedStorm {
  series: Series;
  baseflow_m3s: ArrayLike<number>;
  method: string;
}

/** The storm's series as a CSV document, one row per time: discharge, baseflow and direct runoff in `units`. */
export function stormToCsv(storm: SeparatedStorm, options: SiteCsvOptions): string {
  const { units, timeZone, siteCode } = options;
  const iso = isoWithOffsetFormatter(timeZone);
  const { series, baseflow_m3s, method } = storm;
  const n = series.time_ms.length;
  if (series.discharge_m3s.length !== n || baseflow_m3s.length !== n) {
    throw new RangeError(`stormToCsv needs as many discharges and baseflows as times; got ${n} times, ${series.discharge_m3s.length} discharges, ${baseflow_m3s.length} baseflows`);
  }
  const q = displayUnit('discharge', units);
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'time', kind: 'time' }, { name: `discharge_${q}`, kind: 'number' },
    { name: `baseflow_${q}`, kind: 'number' }, { name: `direct_runoff_${q}`, kind: 'number' }, { name: 'method', kind: 'text' },
  ];
  const rows: string[][] = [];
  for (let i = 0; i < n; i++) {
    const total = toDisplay('discharge', series.discharge_m3s[i], units);
    const base = toDisplay('discharge', baseflow_m3s[i], units);
    rows.push([siteCode, iso(series.time_ms[i]), csvNumber(total, 6), csvNumber(base, 6), csvNumber(Math.max(0, total - base), 6), method]);
  }
  return csvTable(columns, rows);
}
