// Validation of a rating record's fields: segments, gauged range, dated shifts, fit statistics.
import type { RatingBody } from './types';
import { requireNumber, requireObject, requireOneOf, requireRef, requireText, requireTextList, requireTime } from './checks';
import { RecordValidationError } from './validation-error';

function requireList(k: string, field: string, x: unknown, min: number): unknown[] {
  if (!Array.isArray(x) || x.length < min) throw new RecordValidationError(k, field, `a list of at least ${min}`, x);
  return x;
}

/** Checks a rating's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateRatingBody(x: unknown): asserts x is RatingBody {
  const k = 'rating';
  const o = requireObject(k, 'rating', x);
  requireRef(k, 'siteId', o.siteId);
  requireTime(k, 'validFrom_ms', o.validFrom_ms);
  const segments = requireList(k, 'segments', o.segments, 1);
  segments.forEach((s, i) => {
    const f = `segments[${i}]`;
    const p = requireObject(k, f, s);
    const from = requireNumber(k, `${f}.fromStage_m`, p.fromStage_m, 'm');
    requireNumber(k, `${f}.coefficient`, p.coefficient, 'm³/s per m^b', Number.MIN_VALUE);
    requireNumber(k, `${f}.offset_m`, p.offset_m, 'm');
    requireNumber(k, `${f}.exponent`, p.exponent, '', Number.MIN_VALUE);
    if (i > 0 && !(from > (segments[i - 1] as { fromStage_m: number }).fromStage_m)) {
      throw new RecordValidationError(k, `${f}.fromStage_m`, 'above the previous segment’s fromStage_m', from);
    }
  });
  if (o.gaugedRange_m !== undefined) {
    const r = requireList(k, 'gaugedRange_m', o.gaugedRange_m, 2);
    const lo = requireNumber(k, 'gaugedRange_m[0]', r[0], 'm');
    requireNumber(k, 'gaugedRange_m[1]', r[1], 'm', lo);
    if (r.length !== 2) throw new RecordValidationError(k, 'gaugedRange_m', 'a pair [lowest, highest] in m', r);
  }
  const shifts = requireList(k, 'shifts', o.shifts, 0);
  shifts.forEach((s, i) => {
    const f = `shifts[${i}]`;
    const p = requireObject(k, f, s);
    const t = requireTime(k, `${f}.time_ms`, p.time_ms);
    if (i > 0 && !(t > (shifts[i - 1] as { time_ms: number }).time_ms)) {
      throw new RecordValidationError(k, `${f}.time_ms`, 'after the previous shift’s time_ms', t);
    }
    requireOneOf(k, `${f}.toNext`, p.toNext, ['prorate', 'hold']);
    const curve = requireObject(k, `${f}.curve`, p.curve);
    const points = requireList(k, `${f}.curve.points`, curve.points, 1);
    points.forEach((q, j) => {
      const g = `${f}.curve.points[${j}]`;
      const pt = requireObject(k, g, q);
      const h = requireNumber(k, `${g}.stage_m`, pt.stage_m, 'm');
      requireNumber(k, `${g}.shift_m`, pt.shift_m, 'm');
      if (j > 0 && !(h > (points[j - 1] as { stage_m: number }).stage_m)) {
        throw new RecordValidationError(k, `${g}.stage_m`, 'above the previous point’s stage_m', h);
      }
    });
  });
  const fitted = requireList(k, 'fittedFrom', o.fittedFrom, 0);
  fitted.forEach((id, i) => requireRef(k, `fittedFrom[${i}]`, id));
  if (o.fit !== undefined) {
    const fit = requireObject(k, 'fit', o.fit);
    requireNumber(k, 'fit.standardError_pct', fit.standardError_pct, '%', 0);
    const n = requireNumber(k, 'fit.gaugingCount', fit.gaugingCount, '', 0);
    if (!Number.isInteger(n)) throw new RecordValidationError(k, 'fit.gaugingCount', 'a whole number', n);
    requireTextList(k, 'fit.warnings', fit.warnings);
  }
  requireText(k, 'note', o.note);
}
