// Stage readings with their discharge as CSV for office systems: RFC 4180 (CRLF line ends, fields
// with a comma, quote or line break quoted, quotes doubled), UTF-8, units in the header, ISO 8601
// times with the site's offset.
import { displayUnit, toDisplay, type UnitSystem } from '../units';
import { toIsoWithOffset } from '../time/index';
import { hasDischarge } from '../rating/index';
import type { ReadingWithDischarge } from '../readings/index';

/** One reading row to export: the stored reading and its discharge (m³/s; NaN, none, without a rating). */
export type ReadingExportRow = Pick<ReadingWithDischarge, 'reading' | 'discharge_m3s' | 'shift_m' | 'extrapolated'>;

/** What the CSV describes: site code, its time zone (for the offsets) and the units to write. */
export interface ReadingCsvOptions {
  siteCode: string;
  timeZone: string;
  units: UnitSystem;
}

/** Quotes one field as RFC 4180 §2 rules 5–7 ask: only when it holds a comma, quote, CR or LF. */
export function csvField(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

/** Joins rows of fields into an RFC 4180 document (CRLF after every record, including the last). */
export function csvDocument(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.map(csvField).join(',') + '\r\n').join('');
}

function num(v: number, decimals: number): string {
  return v.toFixed(decimals);
}

/** The readings as a CSV document, oldest first as given; stage and discharge in `units`. */
export function readingsToCsv(rows: readonly ReadingExportRow[], options: ReadingCsvOptions): string {
  const { units, timeZone, siteCode } = options;
  const stageUnit = displayUnit('stage', units);
  const qUnit = displayUnit('discharge', units);
  const header = [
    'site', 'time', `stage_${stageUnit}`, `shift_${stageUnit}`, `discharge_${qUnit}`, 'extrapolated', 'source', 'quality',
    'observer', 'note', 'warnings', 'latitude_deg', 'longitude_deg', 'gps_accuracy_m', 'id', 'rev',
  ];
  const out: string[][] = [header];
  const stageDecimals = units === 'us' ? 3 : 4;
  for (const r of rows) {
    const x = r.reading;
    out.push([
      siteCode,
      toIsoWithOffset(x.time_ms, timeZone),
      num(toDisplay('stage', x.stage_m, units), stageDecimals),
      num(toDisplay('stage', r.shift_m, units), stageDecimals),
      !hasDischarge(r.discharge_m3s) ? '' : String(Number(toDisplay('discharge', r.discharge_m3s, units).toPrecision(6))),
      r.extrapolated ? 'yes' : 'no',
      x.source,
      x.quality,
      x.observer,
      x.note,
      x.warnings.join(' '),
      x.gps ? String(x.gps.lat) : '',
      x.gps ? String(x.gps.lon) : '',
      x.gps ? String(x.gps.accuracy_m) : '',
      x.id,
      x.rev,
    ]);
  }
  return csvDocument(out);
}
