// Validation of a stage reading's fields.
import type { ReadingBody } from './types';
import { READING_QUALITIES, READING_SOURCES } from './types';
import { RecordValidationError } from './validation-error';
import { requireLatLon, requireNumber, requireObject, requireOneOf, requireRef, requireText, requireTextList, requireTime } from './checks';

/** Largest magnitude of stage accepted, m: anything beyond is a typing slip, not a gauge height. */
export const MAX_ABS_STAGE_M = 1000;

/** Checks a reading's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateReadingBody(x: unknown): asserts x is ReadingBody {
  const k = 'reading';
  const o = requireObject(k, 'reading', x);
  requireRef(k, 'siteId', o.siteId);
  requireTime(k, 'time_ms', o.time_ms);
  requireNumber(k, 'stage_m', o.stage_m, 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
  requireOneOf(k, 'source', o.source, READING_SOURCES);
  requireOneOf(k, 'quality', o.quality, READING_QUALITIES);
  requireText(k, 'observer', o.observer, false, 200);
  requireText(k, 'note', o.note);
  requireTextList(k, 'warnings', o.warnings);
  if (o.gps !== undefined) {
    requireLatLon(k, 'gps', o.gps);
    const g = o.gps as Record<string, unknown>;
    requireNumber(k, 'gps.accuracy_m', g.accuracy_m, 'm', 0);
    requireTime(k, 'gps.time_ms', g.time_ms);
  }
  if (o.loggerCheck !== undefined) {
    const c = requireObject(k, 'loggerCheck', o.loggerCheck);
    requireNumber(k, 'loggerCheck.logger_m', c.logger_m, 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
    // A check compares the logger with another gauge: the logger cannot check itself.
    if (o.source === 'logger') throw new RecordValidationError(k, 'source', 'a gauge other than the logger for a check reading', o.source);
  }
}
