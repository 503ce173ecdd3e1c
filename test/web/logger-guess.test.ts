// The logger import's first guess on each file shape: separate date and time columns, one date-time
// column, ISO 8601 with and without an offset, day-first and month-first dates (asked when both read),
// 24-hour times with and without seconds. Files are invented; every guess is then read through papaparse
// and core's reader, and the instants are checked against ISO 8601 read by hand (Date.UTC).
import { describe, expect, it } from 'vitest';
import { guessLoggerMapping } from '../../web/logger/guess-mapping';
import { previewLogger, readLoggerFile } from '../../web/logger/read-logger';
import type { LoggerMapping } from '../../core';

const UTC = { kind: 'fixed-offset', offset_min: 0 } as const;

/** A 15-minute file's data lines over `n` steps from 2026-03-25 22:00 UTC (so it crosses midnight). */
function lines(n: number, stamp: (y: number, mo: number, d: number, h: number, mi: number) => string, sep = ','): string[] {
  return Array.from({ length: n }, (_, i) => {
    const t = new Date(Date.UTC(2026, 2, 25, 22, 0) + i * 15 * 60_000);
    return `${stamp(t.getUTCFullYear(), t.getUTCMonth() + 1, t.getUTCDate(), t.getUTCHours(), t.getUTCMinutes())}${sep}${(0.5 + i / 1000).toFixed(3).replace('.', sep === ';' ? ',' : '.')}`;
  });
}
const p2 = (x: number) => String(x).padStart(2, '0');
const expected = (n: number) => Array.from({ length: n }, (_, i) => Date.UTC(2026, 2, 25, 22, 0) + i * 15 * 60_000);

/** Guess, read the whole file with the guess and the clock chosen, and give both. */
async function guessAndRead(text: string, clock: LoggerMapping['clock'] = UTC) {
  const { rows, delimiter } = previewLogger(text);
  const guess = guessLoggerMapping(rows, delimiter);
  const { series, rows: read } = await readLoggerFile(text, { ...guess.mapping, clock });
  return { guess, series, problems: read.problems };
}

describe('the first guess reads each file shape right', () => {
  it('separate Date and Time columns (ISO dates, times without seconds): not every row at midnight', async () => {
    const text = ['Logger 4471', 'Date,Time,Level (m)', ...lines(12, (y, mo, d, h, mi) => `${y}-${p2(mo)}-${p2(d)},${p2(h)}:${p2(mi)}`)].join('\n');
    const { guess, series, problems } = await guessAndRead(text);
    expect(guess.mapping).toMatchObject({ firstDataLine: 3, dateColumn: 1, timeColumn: 2, levelColumn: 3, timeFormat: 'year-month-day' });
    expect(problems).toEqual([]);
    expect(Array.from(series.time_ms)).toEqual(expected(12));
  });

  it('separate date and time columns, day-first dates with dots, times with seconds, semicolons and decimal commas', async () => {
    const text = ['Datum;Zeit;Pegel', ...lines(12, (y, mo, d, h, mi) => `${p2(d)}.${p2(mo)}.${y};${p2(h)}:${p2(mi)}:00`, ';')].join('\n');
    const { guess, series, problems } = await guessAndRead(text);
    expect(guess.mapping).toMatchObject({ delimiter: ';', decimalMark: ',', dateColumn: 1, timeColumn: 2, timeFormat: 'day-month-year' });
    expect(guess.bothDateOrders).toBe(false); // 25 cannot be a month
    expect(problems).toEqual([]);
    expect(Array.from(series.time_ms)).toEqual(expected(12));
    expect(series.level_m[1]).toBe(0.501);
  });

  it('one date-time column with seconds', async () => {
    const text = ['Date Time,Level', ...lines(8, (y, mo, d, h, mi) => `${y}-${p2(mo)}-${p2(d)} ${p2(h)}:${p2(mi)}:00`)].join('\n');
    const { guess, series } = await guessAndRead(text);
    expect(guess.mapping).toMatchObject({ firstDataLine: 2, timeColumn: 1, levelColumn: 2, timeFormat: 'year-month-day' });
    expect(guess.mapping.dateColumn).toBeUndefined();
    expect(Array.from(series.time_ms)).toEqual(expected(8));
  });

  it('ISO 8601 with an offset in every stamp (+13:00 and Z both read to the same instants)', async () => {
    const plus13 = ['time,level', ...lines(8, (y, mo, d, h, mi) => {
      const t = new Date(Date.UTC(y, mo - 1, d, h, mi) + 13 * 3_600_000);
      return `${t.getUTCFullYear()}-${p2(t.getUTCMonth() + 1)}-${p2(t.getUTCDate())}T${p2(t.getUTCHours())}:${p2(t.getUTCMinutes())}:00+13:00`;
    })].join('\n');
    const z = ['time,level', ...lines(8, (y, mo, d, h, mi) => `${y}-${p2(mo)}-${p2(d)}T${p2(h)}:${p2(mi)}Z`)].join('\n');
    for (const text of [plus13, z]) {
      const { guess, series } = await guessAndRead(text, { kind: 'in-stamp' });
      expect(guess.mapping).toMatchObject({ timeColumn: 1, timeFormat: 'year-month-day' });
      expect(Array.from(series.time_ms)).toEqual(expected(8));
    }
  });

  it('ISO 8601 without an offset (the clock chosen says what it means)', async () => {
    const text = ['time,level', ...lines(8, (y, mo, d, h, mi) => `${y}-${p2(mo)}-${p2(d)}T${p2(h)}:${p2(mi)}:00`)].join('\n');
    const { series } = await guessAndRead(text, { kind: 'fixed-offset', offset_min: -5 * 60 });
    // 22:00 at UTC−05:00 is 03:00 UTC the next day.
    expect(Array.from(series.time_ms)).toEqual(expected(8).map((t) => t + 5 * 3_600_000));
  });

  it('month-first dates when a day above 12 shows it', async () => {
    const text = ['Date,Time,Level', ...lines(8, (y, mo, d, h, mi) => `${p2(mo)}/${p2(d)}/${y},${p2(h)}:${p2(mi)}`)].join('\n');
    const { guess, series } = await guessAndRead(text);
    expect(guess.mapping.timeFormat).toBe('month-day-year');
    expect(guess.bothDateOrders).toBe(false);
    expect(Array.from(series.time_ms)).toEqual(expected(8));
  });

  it('asks when the dates read both day-first and month-first', () => {
    // 03/04/2026 … 03/05/2026: every date reads both ways.
    const rows = [['Date', 'Time', 'Level'], ...Array.from({ length: 8 }, (_, i) => [`0${3 + Math.floor(i / 4)}/04/2026`, `${p2(10 + (i % 4))}:00`, '0.5'])];
    const guess = guessLoggerMapping(rows, ',');
    expect(guess.bothDateOrders).toBe(true);
    expect(guess.mapping).toMatchObject({ dateColumn: 1, timeColumn: 2 });
  });

  it('never offers a way of reading that puts most rows at a time already read', () => {
    // Dates alone in column 1 read too (as midnight): that way repeats 11 of 12 times and is not offered.
    const rows = [['Date', 'Time', 'Level'], ...Array.from({ length: 12 }, (_, i) => ['2026-03-25', `${p2(10 + Math.floor(i / 4))}:${p2((i % 4) * 15)}`, '0.5'])];
    const guess = guessLoggerMapping(rows, ',');
    expect(guess.mapping.dateColumn).toBe(1);
    expect(guess.mapping.timeColumn).toBe(2);
  });
});
