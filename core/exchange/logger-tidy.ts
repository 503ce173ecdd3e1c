// Puts the rows read from a logger file in time order and keeps one value per time: a line whose time
// repeats an earlier line's is reported, never stored twice.
import type { LoggerDuplicate, LoggerRows } from './logger-reader';

/** A logger record ready to correct and store: times (UTC ms, strictly ascending), levels (m), source lines. */
export interface LoggerSeries {
  time_ms: Float64Array;
  level_m: Float64Array;
  line: Int32Array;
  /** Lines left out because an earlier line has the same time, in line order. */
  duplicates: LoggerDuplicate[];
}

/** The rows sorted by time (file order among equal times), with repeated times reported and left out. */
export function tidyLoggerRows(rows: Pick<LoggerRows, 'time_ms' | 'level_m' | 'line'>): LoggerSeries {
  const n = rows.time_ms.length;
  let order: Int32Array | undefined;
  for (let i = 1; i < n; i++) {
    if (rows.time_ms[i] < rows.time_ms[i - 1]) {
      order = new Int32Array(n);
      for (let k = 0; k < n; k++) order[k] = k;
      order.sort((a, b) => rows.time_ms[a] - rows.time_ms[b] || rows.line[a] - rows.line[b]);
      break;
    }
  }
  const time_ms = new Float64Array(n);
  const level_m = new Float64Array(n);
  const line = new Int32Array(n);
  const duplicates: LoggerDuplicate[] = [];
  let m = 0;
  for (let k = 0; k < n; k++) {
    const i = order ? order[k] : k;
    const t = rows.time_ms[i];
    if (m > 0 && time_ms[m - 1] === t) {
      duplicates.push({ line: rows.line[i], firstLine: line[m - 1], time_ms: t });
      continue;
    }
    time_ms[m] = t;
    level_m[m] = rows.level_m[i];
    line[m] = rows.line[i];
    m++;
  }
  duplicates.sort((a, b) => a.line - b.line);
  return { time_ms: time_ms.slice(0, m), level_m: level_m.slice(0, m), line: line.slice(0, m), duplicates };
}
