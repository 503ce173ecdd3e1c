import { requireFinite } from './validate';
import type { Rating, RatingSegment } from './types';

/** One row of a rating table as the office hands it out: gauge height (m) and discharge (m³/s). */
export interface TableRow {
  stage_m: number;
  discharge_m3s: number;
}

/**
 * A table kept as a rating with log–log interpolation between its rows: between rows i and i+1,
 * ln Q is linear in ln(h − e), which is exactly a power-law segment Q = C_i·(h − e)^b_i from row i
 * with b_i = ln(Q_{i+1}/Q_i)/ln((h_{i+1} − e)/(h_i − e)) and C_i = Q_i/(h_i − e)^b_i. The first
 * piece reaches down to the offset, the last one carries on above the top row (extrapolation).
 * Rows with zero discharge are allowed at the bottom only, at or below the offset. offset_m (m) is the
 * gauge height of zero flow; by default the highest stage with zero discharge in the table.
 * Every row is reproduced exactly (to rounding); a zero-flow row above a given offset cannot be, and is
 * refused. Throws a RangeError naming the row that is wrong.
 */
export function ratingFromTable(rows: readonly TableRow[], offset_m?: number): Rating {
  if (!Array.isArray(rows)) throw new RangeError('ratingFromTable needs a list of (stage, discharge) rows');
  rows.forEach((r, i) => {
    requireFinite('ratingFromTable', `stage_m in row ${i + 1}`, r?.stage_m);
    requireFinite('ratingFromTable', `discharge_m3s in row ${i + 1}`, r?.discharge_m3s);
    if (r.discharge_m3s < 0) throw new RangeError(`ratingFromTable needs discharges ≥ 0 m³/s; row ${i + 1} has ${r.discharge_m3s}`);
    if (i > 0 && !(r.stage_m > rows[i - 1].stage_m)) {
      throw new RangeError(`ratingFromTable needs stages strictly ascending; row ${i + 1} at ${r.stage_m} m is not above row ${i} at ${rows[i - 1].stage_m} m`);
    }
    if (i > 0 && rows[i - 1].discharge_m3s > 0 && !(r.discharge_m3s > rows[i - 1].discharge_m3s)) {
      throw new RangeError(`ratingFromTable needs discharges strictly rising with stage; row ${i + 1} has ${r.discharge_m3s} m³/s, not above row ${i}`);
    }
  });
  const flowing = rows.filter((r) => r.discharge_m3s > 0);
  const dry = rows.filter((r) => r.discharge_m3s === 0);
  if (flowing.length < 2) throw new RangeError(`ratingFromTable needs at least 2 rows with discharge above 0; got ${flowing.length}`);
  const e = offset_m ?? (dry.length > 0 ? dry[dry.length - 1].stage_m : undefined);
  if (e === undefined) {
    throw new RangeError('ratingFromTable needs the stage of zero flow: give an offset, or a row with discharge 0 at the bottom of the table');
  }
  requireFinite('ratingFromTable', 'offset_m', e);
  // A dry row above the offset could not be reproduced: the first piece flows everywhere above the offset.
  const dryAbove = rows.findIndex((r) => r.discharge_m3s === 0 && r.stage_m > e);
  if (dryAbove >= 0) {
    throw new RangeError(
      `ratingFromTable cannot reproduce row ${dryAbove + 1}: it gives no flow at ${rows[dryAbove].stage_m} m, above the stage of zero flow ${e} m; ` +
        `give the stage of zero flow at or above ${rows[dryAbove].stage_m} m, or remove that row`,
    );
  }
  if (!(e < flowing[0].stage_m)) {
    throw new RangeError(`ratingFromTable needs the offset below the lowest row with flow (${flowing[0].stage_m} m); got ${e} m`);
  }
  const segments: RatingSegment[] = [];
  for (let i = 0; i + 1 < flowing.length; i++) {
    const a = flowing[i];
    const b = flowing[i + 1];
    const exponent = Math.log(b.discharge_m3s / a.discharge_m3s) / Math.log((b.stage_m - e) / (a.stage_m - e));
    const coefficient = a.discharge_m3s / Math.pow(a.stage_m - e, exponent);
    // The first piece also applies below its row, down to the offset (validateSegments lets the first segment reach down).
    segments.push({ fromStage_m: a.stage_m, coefficient, offset_m: e, exponent });
  }
  return { segments };
}
