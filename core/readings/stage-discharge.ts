// A site's stage record with the discharge of every value through the rating in force at its time: what
// the phone's and the office's lists and exports read (core's dischargeThrough over the joined record).
import { dischargeThrough, type DatedRating, type DischargeSeries } from '../rating/index';
import type { ReadingRecord } from '../records/index';
import { joinStageRecord, spotSeriesOf, type StageLoggerDay, type StageRecord } from './stage-record';

/** The stage record with, per value, discharge (m³/s; NaN without a rating), shift (m), flag and rating. */
export interface StageRecordWithDischarge extends StageRecord, DischargeSeries {
  /** The spot readings the record's `spot` indices point into (time order). */
  readings: ReadingRecord[];
  /** The logger days the record's `day` indices point into (as given). */
  loggerDays: readonly StageLoggerDay[];
}

/**
 * The stage record of a site for from_ms ≤ time ≤ to_ms (UTC ms) from its live readings (any order) and
 * logger days, each value with its discharge through the rating in force at its time and that rating's
 * shifts. Deleted readings and logger days are left out.
 */
export function stageRecordWithDischarge(
  ratings: readonly DatedRating[],
  readings: readonly ReadingRecord[],
  loggerDays: readonly StageLoggerDay[],
  from_ms = -Infinity,
  to_ms = Infinity,
): StageRecordWithDischarge {
  const live = readings.filter((r) => r.deleted !== true);
  const { readings: sorted, spots } = spotSeriesOf(live);
  const record = joinStageRecord(spots, loggerDays, from_ms, to_ms);
  return { ...record, ...dischargeThrough(ratings, record.time_ms, record.stage_m), readings: sorted, loggerDays };
}
