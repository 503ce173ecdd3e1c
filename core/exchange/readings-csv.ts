// Stage readings with their discharge as a CSV table for office systems: RFC 4180, UTF-8 with a
// byte-order mark, units in the header, ISO 8601 times with the site's offset, free text neutralised.
import { displayUnit, toDisplay, type UnitSystem } from '../units';
import { hasDischarge } from '../rating/index';
import type { ReadingWithDischarge } from '../readings/index';
import { isoWithOffsetFormatter } from './iso-times';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';

/**
 * One row of a site's stage record to export: a stored spot reading, or a logger value (its reading
 * carries the logger day's id and rev, the corrected stage and source 'logger', and `logger` holds the raw
 * value and the correction, m), with its discharge (m³/s; NaN, none, without a rating) and shift (m).
 */
export type ReadingExportRow = Pick<ReadingWithDischarge, 'reading' | 'discharge_m3s' | 'shift_m' | 'extrapolated'> & {
  logger?: { raw_m: number; correction_m: number };
};

/**
 * Significant digits of an exported discharge: three, the precision a stage–discharge rating supports
 * (common practice: discharges are published to three significant figures).
 */
export const DISCHARGE_DIGITS = 3;

/** What the CSV describes: site code, its time zone (for the offsets) and the units to write. */
export interface ReadingCsvOptions {
  siteCode: string;
  timeZone: string;
  units: UnitSystem;
  /** When given: a last column `photos` naming each reading's photos (by reading id; names joined by spaces). */
  photos?: ReadonlyMap<string, readonly string[]>;
}

/**
 * The rows of a site's stage record as a CSV document, oldest first as given; stage and discharge in
 * `units`. Logger values give their raw value and correction (the stage column is raw + correction) and
 * leave the quality empty (a logger value has no reader's grade).
 */
export function readingsToCsv(rows: readonly ReadingExportRow[], options: ReadingCsvOptions): string {
  const { units, timeZone, siteCode } = options;
  const iso = isoWithOffsetFormatter(timeZone);
  const h = displayUnit('stage', units);
  const q = displayUnit('discharge', units);
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'time', kind: 'time' }, { name: `stage_${h}`, kind: 'number' },
    { name: `shift_${h}`, kind: 'number' }, { name: `discharge_${q}`, kind: 'number' }, { name: 'extrapolated', kind: 'text' },
    { name: 'source', kind: 'text' }, { name: 'quality', kind: 'text' }, { name: 'observer', kind: 'text' },
    { name: 'note', kind: 'text' }, { name: `logger_raw_${h}`, kind: 'number' }, { name: `correction_${h}`, kind: 'number' }, { name: 'warnings', kind: 'text' }, { name: 'latitude_deg', kind: 'number' },
    { name: 'longitude_deg', kind: 'number' }, { name: 'gps_accuracy_m', kind: 'number' }, { name: 'id', kind: 'text' },
    { name: 'rev', kind: 'text' },
    ...(options.photos ? [{ name: 'photos', kind: 'text' } as const] : []),
  ];
  const stageDecimals = units === 'us' ? 3 : 4;
  const out = rows.map((r) => {
    const x = r.reading;
    return [
      siteCode,
      iso(x.time_ms),
      toDisplay('stage', x.stage_m, units).toFixed(stageDecimals),
      toDisplay('stage', r.shift_m, units).toFixed(stageDecimals),
      !hasDischarge(r.discharge_m3s) ? '' : csvNumber(toDisplay('discharge', r.discharge_m3s, units), DISCHARGE_DIGITS),
      r.extrapolated ? 'yes' : 'no',
      x.source,
      r.logger ? '' : x.quality,
      x.observer,
      x.note,
      r.logger ? toDisplay('stage', r.logger.raw_m, units).toFixed(stageDecimals) : '',
      r.logger ? toDisplay('stage', r.logger.correction_m, units).toFixed(stageDecimals) : '',
      x.warnings.join(' '),
      csvNumber(x.gps?.lat),
      csvNumber(x.gps?.lon),
      csvNumber(x.gps?.accuracy_m),
      x.id,
      x.rev,
      ...(options.photos ? [(options.photos.get(x.id) ?? []).join(' ')] : []),
    ];
  });
  return csvTable(columns, out);
}
