// Gaugings (discharge measurements) as a CSV table for office systems: RFC 4180, UTF-8 with a
// byte-order mark, units in the header, ISO 8601 times with the site's offset, free text neutralised.
import { displayUnit, toDisplay, type UnitSystem } from '../units';
import { isoWithOffsetFormatter } from './iso-times';
import type { GaugingRecord } from '../records/index';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';

/** What a table describes: site code, its time zone (for the offsets) and the units to write. */
export interface SiteCsvOptions {
  siteCode: string;
  timeZone: string;
  units: UnitSystem;
  /** When given: a last column `photos` naming each record's photos (by record id; names joined by spaces). */
  photos?: ReadonlyMap<string, readonly string[]>;
}

/** The gaugings as a CSV document in the order given; mean stage and discharge in `units`. */
export function gaugingsToCsv(gaugings: readonly GaugingRecord[], options: SiteCsvOptions): string {
  const { units, timeZone, siteCode } = options;
  const iso = isoWithOffsetFormatter(timeZone);
  const h = displayUnit('stage', units);
  const q = displayUnit('discharge', units);
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'time', kind: 'time' }, { name: `mean_stage_${h}`, kind: 'number' },
    { name: `discharge_${q}`, kind: 'number' }, { name: 'method', kind: 'text' }, { name: 'grade', kind: 'text' },
    { name: 'verticals', kind: 'number' }, { name: 'observer', kind: 'text' }, { name: 'note', kind: 'text' },
    { name: 'id', kind: 'text' }, { name: 'rev', kind: 'text' },
    ...(options.photos ? [{ name: 'photos', kind: 'text' } as const] : []),
  ];
  const rows = gaugings.map((g) => [
    siteCode,
    iso(g.time_ms),
    toDisplay('stage', g.meanStage_m, units).toFixed(units === 'us' ? 3 : 4),
    csvNumber(toDisplay('discharge', g.discharge_m3s, units), 6),
    g.method,
    g.grade,
    g.verticals ? String(g.verticals.length) : '',
    g.observer,
    g.note,
    g.id,
    g.rev,
    ...(options.photos ? [(options.photos.get(g.id) ?? []).join(' ')] : []),
  ]);
  return csvTable(columns, rows);
}
