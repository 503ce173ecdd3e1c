// Ratings as CSV tables for office systems: the power-law segments with their coefficients (SI), and
// each rating as a stage–discharge table. RFC 4180, UTF-8 with a byte-order mark, units in the header.
import { displayUnit, fromDisplay, toDisplay } from '../units';
import { dischargeAt, isExtrapolated, RATING_TABLE_MAX_ROWS, zeroFlowStage_m } from '../rating/index';
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

/** Options of one printed rating table: first and last stage (m) and the step in display units. */
export interface RatingTableCsvOptions extends SiteCsvOptions {
  /** Lowest stage wanted, m; default the gauge height of zero flow. Rows start at the first round stage at or above it. */
  from_m?: number;
  /** Highest stage, m; default the gauged range's top plus RATING_TABLE_HEADROOM_M. */
  top_m?: number;
  /** Step in display units; default 0.01 m or 0.05 ft. */
  step?: number;
}

/** Decimals a printed stage keeps: 4 in metres, 3 in feet. */
function stageDecimals(units: SiteCsvOptions['units']): number {
  return units === 'us' ? 3 : 4;
}

/**
 * The printed rows of one rating's table (no shift applied): from the first round stage (a whole number
 * of steps, in display units) at or above from_m up to top_m; each discharge is that of the stage as
 * printed, so a row can be checked by hand from the equation; the zero-flow row is not extrapolated.
 */
export function printedRatingTable(rating: RatingRecord, options: RatingTableCsvOptions): string[][] {
  const { units, timeZone, siteCode } = options;
  const step = options.step ?? (units === 'us' ? 0.05 : 0.01);
  const decimals = stageDecimals(units);
  const from_m = options.from_m ?? zeroFlowStage_m(rating);
  const lastBreak = rating.segments[rating.segments.length - 1].fromStage_m;
  const top_m = Math.max(options.top_m ?? Math.max(rating.gaugedRange_m?.[1] ?? lastBreak, lastBreak, from_m) + RATING_TABLE_HEADROOM_M, from_m);
  // Whole steps in display units; the slack keeps 0.3/0.1 = 2.999… from skipping a row.
  const first = Math.ceil(toDisplay('stage', from_m, units) / step - 1e-9);
  const last = Math.floor(toDisplay('stage', top_m, units) / step + 1e-9);
  if (last - first + 1 > RATING_TABLE_MAX_ROWS) {
    throw new RangeError(`A rating table would have ${last - first + 1} rows; at most ${RATING_TABLE_MAX_ROWS} are allowed, so use a larger step`);
  }
  const validFrom = toIsoWithOffset(rating.validFrom_ms, timeZone);
  const rows: string[][] = [];
  for (let k = first; k <= last; k++) {
    const printed = (k * step).toFixed(decimals);
    const stage_m = fromDisplay('stage', Number(printed), units);
    const q = dischargeAt(rating, stage_m);
    const extrapolated = q > 0 && isExtrapolated(rating, stage_m);
    rows.push([siteCode, rating.id, validFrom, printed, csvNumber(toDisplay('discharge', q, units), 6), extrapolated ? 'yes' : 'no']);
  }
  return rows;
}

/** The columns of a printed rating table: site, rating, start, stage and discharge in display units, extrapolated. */
function tableColumns(units: SiteCsvOptions['units']): CsvColumn[] {
  return [
    { name: 'site', kind: 'text' }, { name: 'rating_id', kind: 'text' }, { name: 'valid_from', kind: 'time' },
    { name: `stage_${displayUnit('stage', units)}`, kind: 'number' }, { name: `discharge_${displayUnit('discharge', units)}`, kind: 'number' },
    { name: 'extrapolated', kind: 'text' },
  ];
}

/**
 * Ratings as stage–discharge tables, oldest rating first, one CSV (the one writer of a rating table: the
 * export and the rating screen's "Share or save as CSV" both call it). See printedRatingTable for the rows.
 */
export function ratingTablesToCsv(ratings: readonly RatingRecord[], options: RatingTableCsvOptions): string {
  const rows: string[][] = [];
  for (const r of byStart(ratings)) rows.push(...printedRatingTable(r, options));
  return csvTable(tableColumns(options.units), rows);
}
