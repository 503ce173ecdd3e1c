// The readings list of a site from its stage record (core's join): spot readings one row each, the
// logger record one collapsed row per logger day (its count, range, corrections and file), newest first.
import { hasDischarge, type ReadingWithDischarge, type StageRecordWithDischarge } from '../../../core';

/** A logger day in the list: the values of one day record with their ranges (stages and corrections in m, discharge in m³/s). */
export interface LoggerDayItem {
  kind: 'logger-day';
  key: string;
  fileName: string;
  note: string;
  count: number;
  first_ms: number;
  last_ms: number;
  minStage_m: number;
  maxStage_m: number;
  minCorrection_m: number;
  maxCorrection_m: number;
  /** Highest discharge of the day, m³/s (NaN when no value had a rating in force). */
  maxDischarge_m3s: number;
  /** How many of the day's values lie outside the rating's gauged range. */
  extrapolated: number;
  /** Check readings the corrections came from. */
  checks: number;
}

/** A row of the list: a spot reading, or one logger day collapsed. */
export type ListItem = { kind: 'reading'; key: string; row: ReadingWithDischarge } | LoggerDayItem;

/** The record's rows newest first: each spot reading, and each run of one logger day's values as one item. */
export function listItems(record: StageRecordWithDischarge): ListItem[] {
  const out: ListItem[] = [];
  const n = record.time_ms.length;
  let open: LoggerDayItem | undefined;
  let openDay = -1;
  for (let i = n - 1; i >= 0; i--) {
    const s = record.spot[i];
    if (s >= 0) {
      open = undefined;
      const reading = record.readings[s];
      const at = record.ratingIndex[i];
      out.push({
        kind: 'reading', key: reading.id,
        row: { reading, discharge_m3s: record.discharge_m3s[i], shift_m: record.shift_m[i], extrapolated: record.extrapolated[i] === 1, ratingId: at >= 0 ? record.ratingIds[at] : undefined },
      });
      continue;
    }
    const d = record.day[i];
    const stage = record.stage_m[i];
    const corr = record.correction_m[i];
    const q = record.discharge_m3s[i];
    if (!open || openDay !== d) {
      const day = record.loggerDays[d];
      open = {
        kind: 'logger-day', key: `${day.day}-${d}-${i}`, fileName: day.fileName, note: day.note, count: 0,
        first_ms: record.time_ms[i], last_ms: record.time_ms[i], minStage_m: stage, maxStage_m: stage,
        minCorrection_m: corr, maxCorrection_m: corr, maxDischarge_m3s: NaN, extrapolated: 0, checks: day.checks.length,
      };
      openDay = d;
      out.push(open);
    }
    open.count++;
    open.first_ms = record.time_ms[i];
    open.minStage_m = Math.min(open.minStage_m, stage);
    open.maxStage_m = Math.max(open.maxStage_m, stage);
    open.minCorrection_m = Math.min(open.minCorrection_m, corr);
    open.maxCorrection_m = Math.max(open.maxCorrection_m, corr);
    if (hasDischarge(q) && !(q <= open.maxDischarge_m3s)) open.maxDischarge_m3s = q;
    if (record.extrapolated[i] === 1) open.extrapolated++;
  }
  return out;
}
