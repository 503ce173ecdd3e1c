// Ratings as CSV tables for office systems: the power-law segments with their coefficients (SI), and
// each rating as a stage–discharge table. RFC 4180, UTF-8 with a byte-order mark, units in the header.
import { displayUnit, fromDisplay, toDisplay } from '../units';
import { ratingTable, zeroFlowStage_m } from '../rating/index';
import { toIsoWithOffset } from '../time/index';
import type { RatingRecord } from '../records/index';
import { csvNumber, csvTable, type CsvColumn } from './csv-write';
import type { SiteCsvOptions } from './gaugings-csv';

/** Default top of an exported rating table above the gauged range's top, m. */
export const RATING_TABLE_HEADROOM_M = 0.5;

/** When each rating stops applying: the next rating's start (UTC ms), or null for the latest. */
function validTo(ratings: readonly RatingRecord[], i: number): number | null {
  return i + 1 < ratings.length ? ratings[i + 1].validFrom_ms : null;
}

function byStart(ratings: readonly RatingRecord[]): RatingRecord[] {
  return [...ratings].sort((a, b) => a.validFrom_ms - b.validFrom_ms);
}

/**
 * The ratings' segments, one row per segment, oldest rating first: Q = coefficient·(h + shift − offset)^exponent
 * with h and offset in m and Q in m³/s whatever the site's display units (the coefficients are stated in SI).
 */
export function ratingSegmentsToCsv(ratings: readonly RatingRecord[], options: SiteCsvOptions): string {
  const { timeZone, siteCode } = options;
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'rating_id', kind: 'text' }, { name: 'valid_from', kind: 'time' },
    { name: 'valid_to', kind: 'time' }, { name: 'segment', kind: 'number' }, { name: 'from_stage_m', kind: 'number' },
    { name: 'coefficient_m3s_per_m^b', kind: 'number' }, { name: 'offset_m', kind: 'number' }, { name: 'exponent_b', kind: 'number' },
    { name: 'gauged_from_m', kind: 'number' }, { name: 'gauged_to_m', kind: 'number' }, { name: 'dated_shifts', kind: 'number' },
    { name: 'note', kind: 'text' },
  ];
  const sorted = byStart(ratings);
  const rows: string[][] = [];
  sorted.forEach((r, i) => {
    const to = validTo(sorted, i);
    r.segments.forEach((s, k) => rows.push([
      siteCode, r.id, toIsoWithOffset(r.validFrom_ms, timeZone), to === null ? '' : toIsoWithOffset(to, timeZone),
      String(k + 1), csvNumber(s.fromStage_m), csvNumber(s.coefficient, 12), csvNumber(s.offset_m), csvNumber(s.exponent, 12),
      csvNumber(r.gaugedRange_m?.[0]), csvNumber(r.gaugedRange_m?.[1]), String(r.shifts.length), r.note,
    ]));
  });
  return csvTable(columns, rows);
}

/**
 * Each rating as a stage–discharge table (no shift applied), oldest rating first: from the gauge height
 * of zero flow up to top_m (m; default the gauged range's top plus RATING_TABLE_HEADROOM_M) every step
 * (in display units: 0.01 m or 0.05 ft by default), with the extrapolated rows marked.
 */
export function ratingTablesToCsv(ratings: readonly RatingRecord[], options: SiteCsvOptions & { top_m?: number; step?: number }): string {
  const { units, timeZone, siteCode } = options;
  const h = displayUnit('stage', units);
  const q = displayUnit('discharge', units);
  const step_m = fromDisplay('stage', options.step ?? (units === 'us' ? 0.05 : 0.01), units);
  const columns: CsvColumn[] = [
    { name: 'site', kind: 'text' }, { name: 'rating_id', kind: 'text' }, { name: 'valid_from', kind: 'time' },
    { name: `stage_${h}`, kind: 'number' }, { name: `discharge_${q}`, kind: 'number' }, { name: 'extrapolated', kind: 'text' },
  ];
  const rows: string[][] = [];
  for (const r of byStart(ratings)) {
    const from_m = zeroFlowStage_m(r);
    const lastBreak = r.segments[r.segments.length - 1].fromStage_m;
    const top_m = options.top_m ?? Math.max(r.gaugedRange_m?.[1] ?? lastBreak, lastBreak, from_m) + RATING_TABLE_HEADROOM_M;
    const from = toIsoWithOffset(r.validFrom_ms, timeZone);
    for (const row of ratingTable(r, from_m, Math.max(top_m, from_m), step_m)) {
      rows.push([
        siteCode, r.id, from, toDisplay('stage', row.stage_m, units).toFixed(units === 'us' ? 3 : 4),
        csvNumber(toDisplay('discharge', row.discharge_m3s, units), 6), row.extrapolated ? 'yes' : 'no',
      ]);
    }
  }
  return csvTable(columns, rows);
}
