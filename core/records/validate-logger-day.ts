// Validation of one day of a logger record: parallel arrays of equal length, times inside the day and
// strictly ascending, finite stages, and the checks the corrections came from.
import type { LoggerDayBody } from './types';
import { MAX_ABS_STAGE_M } from './validate-reading';
import { requireNumber, requireObject, requireRef, requireText, requireTime } from './checks';
import { RecordValidationError } from './validation-error';

/** Most values one logger day may hold: one a second. */
export const MAX_LOGGER_DAY_VALUES = 86_400;
/** Largest drift correction accepted, m: a larger one is a wrong check, not drift. */
export const MAX_ABS_CORRECTION_M = 10;
const DAY_MS = 86_400_000;

function numberList(field: string, x: unknown): unknown[] {
  if (!Array.isArray(x)) throw new RecordValidationError('logger-day', field, 'a list of numbers', x);
  if (x.length > MAX_LOGGER_DAY_VALUES) throw new RecordValidationError('logger-day', field, `at most ${MAX_LOGGER_DAY_VALUES} values`, `${x.length} values`);
  return x;
}

/** Checks a logger day's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateLoggerDayBody(x: unknown): asserts x is LoggerDayBody {
  const k = 'logger-day';
  const o = requireObject(k, 'logger-day', x);
  requireRef(k, 'siteId', o.siteId);
  const day = o.day;
  if (typeof day !== 'number' || !Number.isInteger(day) || day < 0 || day > 100_000_000) {
    throw new RecordValidationError(k, 'day', 'a whole UTC day number from 0 to 100 000 000', day);
  }
  const offsets = numberList('offset_ms', o.offset_ms);
  const raw = numberList('raw_m', o.raw_m);
  const corr = numberList('correction_m', o.correction_m);
  if (offsets.length === 0) throw new RecordValidationError(k, 'offset_ms', 'at least one value', 'an empty list');
  if (raw.length !== offsets.length) throw new RecordValidationError(k, 'raw_m', `${offsets.length} values, one per time`, `${raw.length} values`);
  if (corr.length !== offsets.length) throw new RecordValidationError(k, 'correction_m', `${offsets.length} values, one per time`, `${corr.length} values`);
  let prev = -1;
  for (let i = 0; i < offsets.length; i++) {
    const t = offsets[i];
    if (typeof t !== 'number' || !Number.isInteger(t) || t <= prev || t >= DAY_MS) {
      throw new RecordValidationError(k, `offset_ms[${i}]`, `whole ms after the day's start, above ${prev} and below 86 400 000`, t);
    }
    prev = t;
    requireNumber(k, `raw_m[${i}]`, raw[i], 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
    requireNumber(k, `correction_m[${i}]`, corr[i], 'm', -MAX_ABS_CORRECTION_M, MAX_ABS_CORRECTION_M);
  }
  if (!Array.isArray(o.checks)) throw new RecordValidationError(k, 'checks', 'a list of checks', o.checks);
  o.checks.forEach((c: unknown, i: number) => {
    const ch = requireObject(k, `checks[${i}]`, c);
    requireTime(k, `checks[${i}].time_ms`, ch.time_ms);
    requireNumber(k, `checks[${i}].staff_m`, ch.staff_m, 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
    requireNumber(k, `checks[${i}].logger_m`, ch.logger_m, 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
    if (ch.readingId !== undefined) requireRef(k, `checks[${i}].readingId`, ch.readingId);
  });
  requireText(k, 'fileName', o.fileName, false, 300);
  requireText(k, 'note', o.note);
}
