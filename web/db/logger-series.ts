// Logger days joined into the compact series that plots, storm analysis and exports read: one place
// where the readings' series chunks and the logger's day records meet, day by day, in time order.
import { loggerDayStages, READING_SOURCE_CODES, type LoggerDayRecord } from '../../core/index';
import type { SeriesChunk } from './schema';

/** A logger day as a series chunk: corrected stages, source code 'logger', the day record's id for every entry. */
export function loggerDayChunk(day: LoggerDayRecord): SeriesChunk {
  const { time_ms, stage_m } = loggerDayStages(day);
  return {
    siteId: day.siteId, day: day.day, time_ms, stage_m,
    source: new Uint8Array(time_ms.length).fill(READING_SOURCE_CODES.logger),
    id: new Array<string>(time_ms.length).fill(day.id),
  };
}

/** Two chunks of one site-day merged in time order (a's entry first at equal times); a time both logger chunks hold is kept once. */
function mergeTwo(a: SeriesChunk, b: SeriesChunk, bothLogger: boolean): SeriesChunk {
  const n = a.time_ms.length + b.time_ms.length;
  const time_ms = new Float64Array(n);
  const stage_m = new Float64Array(n);
  const source = new Uint8Array(n);
  const id = new Array<string>(n);
  let i = 0;
  let j = 0;
  let k = 0;
  while (i < a.time_ms.length || j < b.time_ms.length) {
    const takeA = j >= b.time_ms.length || (i < a.time_ms.length && a.time_ms[i] <= b.time_ms[j]);
    const c = takeA ? a : b;
    const x = takeA ? i++ : j++;
    if (bothLogger && !takeA && k > 0 && time_ms[k - 1] === c.time_ms[x]) continue;
    time_ms[k] = c.time_ms[x];
    stage_m[k] = c.stage_m[x];
    source[k] = c.source[x];
    id[k] = c.id[x];
    k++;
  }
  return { siteId: a.siteId, day: a.day, time_ms: time_ms.slice(0, k), stage_m: stage_m.slice(0, k), source: source.slice(0, k), id: id.slice(0, k) };
}

/**
 * The readings' series chunks (day order) with the site's logger days (day order) merged in: one chunk
 * per day, in time order, readings before logger values at equal times. Deleted logger days are left out.
 */
export function withLoggerDays(chunks: readonly SeriesChunk[], days: readonly LoggerDayRecord[]): SeriesChunk[] {
  const live = days.filter((d) => !d.deleted);
  if (live.length === 0) return chunks as SeriesChunk[];
  const out: SeriesChunk[] = [];
  let i = 0;
  let j = 0;
  while (i < chunks.length || j < live.length) {
    if (j >= live.length || (i < chunks.length && chunks[i].day < live[j].day)) {
      out.push(chunks[i++]);
      continue;
    }
    const day = live[j].day;
    let logger = loggerDayChunk(live[j++]);
    // Two logger records of one day (synced from another phone under another id): keep each time once.
    while (j < live.length && live[j].day === day) logger = mergeTwo(logger, loggerDayChunk(live[j++]), true);
    if (i < chunks.length && chunks[i].day === day) out.push(mergeTwo(chunks[i++], logger, false));
    else out.push(logger);
  }
  return out;
}
