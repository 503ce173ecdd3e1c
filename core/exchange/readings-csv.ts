// Stage readings with their discharge as a CSV table for office systems: RFC 4180, UTF-8 with a
// byte-order mark, units in the header, ISO 8601 times with the site's offset, free text neutralised.
import { displayUnit, toDisplay, type UnitSystem } from '../units';
import { hasDischarge } from '../rating/index';
import type { ReadingWithDischarge } from '../readings/index';
import { isoWithOffsetFormatter } from './iso-times';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';

/** One reading row to export: the stored reading and its discharge (m³/s; NaN, none, without a rating), shift (m). */
export type ReadingExportRow = Pick<ReadingWithDischarge, 'reading' | 'discharge_m3s' | 'shift_m' | 'extrapolated'>;

/** What the CSV describes: site code, its time zone (for the offsets) and the units to write. */
export interface ReadingCsvOptions {
  siteCode: string;
  timeZone: string;
  units: UnitSystem;
}

/** The readings as a CSV document, oldest first as given; stage and discharge in `units`. */
export function readingsToCsv(rows: readonly ReadingExportRow[], options: ReadingCsvOptions): string {
  const { units, timeZone, siteCode } = options;
  const iso = isoWithOffsetFormatter(timeZone);
  const h = displayUnit('stage', units);
  const q = displayUnit('discharge', units);
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'time', kind: 'time' }, { name: `stage_${h}`, kind: 'number' },
    { name: `shift_${h}`, kind: 'number' }, { name: `discharge_${q}`, kind: 'number' }, { name: 'extrapolated', kind: 'text' },
    { name: 'source', kind: 'text' }, { name: 'quality', kind: 'text' }, { name: 'observer', kind: 'text' },
    { name: 'note', kind: 'text' }, { name: 'warnings', kind: 'text' }, { name: 'latitude_deg', kind: 'number' },
    { name: 'longitude_deg', kind: 'number' }, { name: 'gps_accuracy_m', kind: 'number' }, { name: 'id', kind: 'text' },
    { name: 'rev', kind: 'text' },
  ];
  const stageDecimals = units === 'us' ? 3 : 4;
  const out = rows.map((r) => {
    const x = r.reading;
    return [
      siteCode,
      iso(x.time_ms),
      toDisplay('stage', x.stage_m, units).toFixed(stageDecimals),
      toDisplay('stage', r.shift_m, units).toFixed(stageDecimals),
      !hasDischarge(r.discharge_m3s) ? '' : csvNumber(toDisplay('discharge', r.discharge_m3s, units), 6),
      r.extrapolated ? 'yes' : 'no',
      x.source,
      x.quality,
      x.observer,
      x.note,
      x.warnings.join(' '),
      csvNumber(x.gps?.lat),
      csvNumber(x.gps?.lon),
      csvNumber(x.gps?.accuracy_m),
      x.id,
      x.rev,
    ];
  });
  return csvTable(columns, out);
}
