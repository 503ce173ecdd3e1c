// A site's stage record (spot readings and logger values, joined by core's stageRecordWithDischarge) as
// the rows the CSV and WaterML writers take: one row per value, in time order, logger values with their
// raw value and correction.
import { loggerDayId } from './logger-days';
import { readingSourceOfCode } from '../records/source-codes';
import type { ReadingRecord } from '../records/index';
import type { StageRecordWithDischarge } from '../readings/index';
import type { ReadingExportRow } from './readings-csv';

/** Every value of the stage record as an export row, in time order (spot readings first at a shared time). */
export function stageExportRows(record: StageRecordWithDischarge): ReadingExportRow[] {
  const n = record.time_ms.length;
  const out: ReadingExportRow[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const shared = { discharge_m3s: record.discharge_m3s[i], shift_m: record.shift_m[i], extrapolated: record.extrapolated[i] === 1 };
    if (record.spot[i] >= 0) {
      out[i] = { reading: record.readings[record.spot[i]], ...shared };
      continue;
    }
    const day = record.loggerDays[record.day[i]];
    const reading: ReadingRecord = {
      id: day.id ?? loggerDayId(day.siteId, day.day), rev: day.rev ?? '', updated_ms: 0,
      siteId: day.siteId, time_ms: record.time_ms[i], stage_m: record.stage_m[i], source: readingSourceOfCode(record.source[i]),
      quality: 'good', observer: '', note: day.note, warnings: [],
    };
    out[i] = { reading, ...shared, logger: { raw_m: record.raw_m[i], correction_m: record.correction_m[i] } };
  }
  return out;
}
