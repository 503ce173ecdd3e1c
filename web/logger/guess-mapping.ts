// A first suggestion for the mapping step from the first lines of a file: where the data start, which
// columns hold the date and time (one column, or a date column and a time column) and the level, the time
// format, the decimal mark. Each way of reading the stamps is tried on every data row shown: the one that
// reads the most rows, each at its own time, is offered; one that puts most rows at a time already seen
// (e.g. a date read alone, every row at midnight) never is. Everything is shown to the user to confirm;
// the clock of the stamps is never suggested (it must be asked).
import { LOGGER_TIME_FORMATS, stampParser, type LoggerMapping, type LoggerTimeFormat } from '../../core';

/** The mapping without its clock, which the user must choose. */
export type MappingWithoutClock = Omit<LoggerMapping, 'clock'>;

/** The suggestion and what the user must be asked about it. */
export interface MappingGuess {
  mapping: MappingWithoutClock;
  /** True when the dates read both day-first and month-first on every row shown: the user must choose. */
  bothDateOrders: boolean;
}

const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/;
const TIME_ONLY = /^\d{1,2}:\d{2}(:\d{2}([.,]\d+)?)?$/;
/** Data rows each way of reading is tried on. */
const SAMPLE = 30;

interface Reading {
  dateColumn?: number;
  timeColumn: number;
  format: LoggerTimeFormat;
  read: number;
  repeated: number;
}

/** How many sample rows a way of reading reads, and how many of those repeat a time already read. */
function tryReading(rows: readonly (readonly string[])[], dateCol: number | undefined, timeCol: number, format: LoggerTimeFormat): Reading {
  const parse = stampParser(format);
  const seen = new Set<number>();
  let read = 0;
  let repeated = 0;
  for (const cells of rows) {
    const time = (cells[timeCol] ?? '').trim();
    const text = dateCol === undefined ? time : `${(cells[dateCol] ?? '').trim()} ${time}`;
    const p = parse(text);
    if (typeof p === 'string') continue;
    const t = p.naive_ms - (p.offset_min ?? 0) * 60_000;
    read++;
    if (seen.has(t)) repeated++;
    seen.add(t);
  }
  return { ...(dateCol === undefined ? {} : { dateColumn: dateCol + 1 }), timeColumn: timeCol + 1, format, read, repeated };
}

/** Whether a way of reading is fit to offer: it reads rows and does not put most of them at a repeated time. */
const fit = (r: Reading) => r.read > 0 && r.repeated * 2 < r.read;

/** The ways to read the stamps of the first data line's cells: a date and time column pair, or one column. */
function candidates(cells: readonly string[]): { dateCol?: number; timeCol: number }[] {
  const out: { dateCol?: number; timeCol: number }[] = [];
  for (let k = 0; k < cells.length; k++) {
    if (k + 1 < cells.length && TIME_ONLY.test(cells[k + 1].trim())) out.push({ dateCol: k, timeCol: k + 1 });
    out.push({ timeCol: k });
  }
  return out;
}

/** The suggestion for preview rows (cells per line, from line 1) split with `delimiter`, with what must be asked. */
export function guessLoggerMapping(rows: readonly (readonly string[])[], delimiter: string): MappingGuess {
  let firstDataLine = 1;
  let best: Reading | undefined;
  let bothDateOrders = false;
  for (let i = 0; i < rows.length && !best; i++) {
    const sample = rows.slice(i, i + SAMPLE);
    let found: Reading[] = [];
    for (const c of candidates(rows[i])) {
      const ways = LOGGER_TIME_FORMATS.map((f) => tryReading(sample, c.dateCol, c.timeCol, f));
      // Only ways that read this line itself (the first data line).
      found.push(...ways.filter((w) => tryReading([rows[i]], c.dateCol, c.timeCol, w.format).read === 1));
    }
    found = found.filter(fit);
    if (found.length === 0) continue;
    // Most rows read, then fewest repeated, then a date and time pair before one column, then format order.
    found.sort((a, b) => b.read - a.read || a.repeated - b.repeated || Number(b.dateColumn !== undefined) - Number(a.dateColumn !== undefined));
    best = found[0];
    firstDataLine = i + 1;
    const other = best.format === 'day-month-year' ? 'month-day-year' : best.format === 'month-day-year' ? 'day-month-year' : undefined;
    bothDateOrders = other !== undefined && found.some((r) => r.format === other && r.read === best!.read && r.dateColumn === best!.dateColumn && r.timeColumn === best!.timeColumn);
  }
  const timeColumn = best?.timeColumn ?? 1;
  const cells = (rows[firstDataLine - 1] ?? []).map((c) => c.trim());
  const after = cells.findIndex((c, k) => k + 1 > timeColumn && NUMBER.test(c));
  const levelColumn = after >= 0 ? after + 1 : timeColumn + 1;
  const sample = rows.slice(firstDataLine - 1, firstDataLine + 9).map((r) => (r[levelColumn - 1] ?? '').trim());
  const decimalMark = delimiter !== ',' && sample.some((c) => /^[+-]?\d*,\d+$/.test(c)) ? ',' : '.';
  const d = delimiter === ';' || delimiter === '\t' ? delimiter : ',';
  return {
    mapping: {
      firstDataLine, delimiter: d, decimalMark, timeColumn, timeFormat: best?.format ?? 'year-month-day', levelColumn, levelUnit: 'm', datumOffset_m: 0,
      ...(best?.dateColumn !== undefined && { dateColumn: best.dateColumn }),
    },
    bothDateOrders,
  };
}

/** The suggested mapping alone (see guessLoggerMapping). */
export function guessMapping(rows: readonly (readonly string[])[], delimiter: string): MappingWithoutClock {
  return guessLoggerMapping(rows, delimiter).mapping;
}
