// Logger files, hostile ones included, read through papaparse (the streaming CSV parser the import worker
// uses) and core's logger reader. Files are invented; expected instants are worked from the stated
// offsets by hand. Zone rules: IANA tz database (New Zealand 2026: daylight time ends 5 April 03:00 NZDT
// → 02:00 NZST, starts 27 September 02:00 NZST → 03:00 NZDT).
import { describe, expect, it } from 'vitest';
import { FRESH_WATER_DENSITY_KGM3, loggerGaps, parseStamp, STANDARD_GRAVITY_MPS2, usualStep_ms, type LoggerMapping } from '../../core';
import { previewLogger, readLoggerFile } from '../../web/logger/read-logger';

const base: LoggerMapping = {
  firstDataLine: 3, delimiter: ',', decimalMark: '.', timeColumn: 1, timeFormat: 'year-month-day',
  clock: { kind: 'fixed-offset', offset_min: 12 * 60 }, levelColumn: 2, levelUnit: 'm', datumOffset_m: 0,
};
const MIN = 60_000;

describe('ordinary files', () => {
  it('reads a file with a byte-order mark, CRLF lines and two header lines in local standard time (UTC+12)', async () => {
    const text = '\ufeffSite KC-01 logger 4471\r\nDate Time,Level (m),Temp (C)\r\n2026-03-01 00:00:00,0.512,14.1\r\n2026-03-01 00:15:00,0.518,14.0\r\n';
    const { series, rows } = await readLoggerFile(text, base);
    expect(rows.problems).toEqual([]);
    // 00:00 at UTC+12 is 12:00 UTC the day before.
    expect(Array.from(series.time_ms)).toEqual([Date.UTC(2026, 1, 28, 12), Date.UTC(2026, 1, 28, 12, 15)]);
    expect(Array.from(series.level_m)).toEqual([0.512, 0.518]);
    expect(Array.from(series.line)).toEqual([3, 4]);
  });

  it('reads LF-only lines and a file whose last line has no line break', async () => {
    const text = 'header\nDate Time,Level\n2026-03-01T06:00,1.25\n2026-03-01T06:15,1.5';
    const { series, rows } = await readLoggerFile(text, { ...base, clock: { kind: 'fixed-offset', offset_min: 0 } });
    expect(rows.problems).toEqual([]);
    expect(Array.from(series.time_ms)).toEqual([Date.UTC(2026, 2, 1, 6), Date.UTC(2026, 2, 1, 6, 15)]);
    expect(Array.from(series.level_m)).toEqual([1.25, 1.5]);
  });

  it('reads ";" separators with decimal commas, separate date and time columns, day/month/year, in cm', async () => {
    const text = 'Datum;Zeit;Pegel cm\n01.03.2026;10:00:00;51,2\n01.03.2026;10:15:00;51,8\n';
    const m: LoggerMapping = {
      ...base, firstDataLine: 2, delimiter: ';', decimalMark: ',', dateColumn: 1, timeColumn: 2, levelColumn: 3,
      timeFormat: 'day-month-year', levelUnit: 'cm', clock: { kind: 'fixed-offset', offset_min: 60 },
    };
    const { series, rows } = await readLoggerFile(text, m);
    expect(rows.problems).toEqual([]);
    expect(Array.from(series.time_ms)).toEqual([Date.UTC(2026, 2, 1, 9), Date.UTC(2026, 2, 1, 9, 15)]);
    expect(series.level_m[0]).toBeCloseTo(0.512, 12);
    expect(series.level_m[1]).toBeCloseTo(0.518, 12);
  });

  it('converts feet (0.3048 m exactly, NIST SP 811) and pressure head (h = p / ρg) and adds the datum offset', async () => {
    const text = 'x\nt,v\n2026-03-01 00:00,2\n';
    const ft = await readLoggerFile(text, { ...base, levelUnit: 'ft', datumOffset_m: 0.1 });
    expect(ft.series.level_m[0]).toBeCloseTo(2 * 0.3048 + 0.1, 12);
    const kpa = await readLoggerFile(text, { ...base, levelUnit: 'kPa' });
    // 2 kPa of fresh water: 2000 Pa / (999.1 kg/m³ × 9.80665 m/s²) = 0.204122… m
    expect(kpa.series.level_m[0]).toBeCloseTo(2000 / (FRESH_WATER_DENSITY_KGM3 * STANDARD_GRAVITY_MPS2), 12);
    expect(kpa.series.level_m[0]).toBeCloseTo(0.204122, 5);
  });

  it('uses the offset written in each stamp when the mapping says stamps carry one', async () => {
    const text = 'a\nb\n2026-03-01T10:00:00+13:00,0.5\n2026-03-01T09:15:00+12:00,0.6\n2026-03-01T00:30:00Z,0.7\n';
    const { series, rows } = await readLoggerFile(text, { ...base, clock: { kind: 'in-stamp' } });
    expect(rows.problems).toEqual([]);
    expect(Array.from(series.time_ms)).toEqual([Date.UTC(2026, 1, 28, 21), Date.UTC(2026, 1, 28, 21, 15), Date.UTC(2026, 2, 1, 0, 30)]);
  });
});

describe('hostile files: every problem names its line', () => {
  it('reports stamps without an offset when every stamp should carry one', async () => {
    const text = 'a\nb\n2026-03-01T10:00:00+13:00,0.5\n2026-03-01 10:15:00,0.6\n';
    const { series, rows } = await readLoggerFile(text, { ...base, clock: { kind: 'in-stamp' } });
    expect(series.time_ms.length).toBe(1);
    expect(rows.problems).toHaveLength(1);
    expect(rows.problems[0].line).toBe(4);
    expect(rows.problems[0].message).toMatch(/Line 4.*no UTC offset/);
  });

  it('reports text in number cells with line and field', async () => {
    const text = 'a\nb\n2026-03-01 00:00,0.5\n2026-03-01 00:15,n/a\n2026-03-01 00:30,\n2026-03-01 00:45,0.6\n';
    const { series, rows } = await readLoggerFile(text, base);
    expect(series.time_ms.length).toBe(2);
    expect(rows.problems.map((p) => [p.line, p.column])).toEqual([[4, 2], [5, 2]]);
    expect(rows.problems[0].message).toBe('Line 4, field 2 holds "n/a"; a level is needed as a number, like 0.734.');
    expect(rows.problems[1].message).toMatch(/^Line 5, field 2 is empty/);
  });

  // The text rule (core/records/text.ts): U+0000 NUL and U+001F are Unicode controls (Cc); U+D800 alone is
  // half a UTF-16 pair (Unicode §3.9 D91; RFC 8259 §8.2).
  it('names a NUL, a control character or a lone surrogate in a cell it reads, with line and field', async () => {
    const text = 'a\nb\n2026-03-01 00:00,0.5\n2026-03-01 00:15,0.5\u0000\n2026-03-01 00:30\u001f,0.6\n2026-03-01 00:45,\ud800\n2026-03-01 01:00,0.7\n';
    const { series, rows } = await readLoggerFile(text, base);
    expect(series.time_ms.length).toBe(2);
    expect(rows.problems.map((p) => p.message)).toEqual([
      'Line 4, field 2 holds a NUL character (U+0000) at character 4; a logger file holds only times and numbers there.',
      'Line 5, field 1 holds a control character (U+001F) at character 17; a logger file holds only times and numbers there.',
      'Line 6, field 2 holds half of a character pair with its other half missing (U+D800) at character 1; a logger file holds only times and numbers there.',
    ]);
  });

  it('refuses a decimal comma where a point is expected, rather than misreading it', async () => {
    const { rows } = await readLoggerFile('a\nb\n2026-03-01 00:00;0,5\n', { ...base, delimiter: ';' });
    expect(rows.problems[0]).toMatchObject({ line: 3, column: 2 });
  });

  it('reports a truncated last line (no line break, fewer fields than the lines before)', async () => {
    const text = 'a\nb\n2026-03-01 00:00,0.5,14.1\n2026-03-01 00:15,0.51,14.0\n2026-03-01 00:30,0.5';
    const { series, rows } = await readLoggerFile(text, base);
    expect(Array.from(series.line)).toEqual([3, 4]);
    expect(rows.problems).toEqual([{ line: 5, message: 'Line 5 has 2 fields where the lines before have 3: the file looks cut off at the end.' }]);
  });

  it('reports a last line cut inside the time', async () => {
    const text = 'a\nb\n2026-03-01 00:00,0.5\n2026-03-01 00:1';
    const { series, rows } = await readLoggerFile(text, base);
    expect(series.time_ms.length).toBe(1);
    expect(rows.problems).toHaveLength(1);
    expect(rows.problems[0].line).toBe(4);
    expect(rows.problems[0].message).toMatch(/cut off/);
  });

  it('reads the hour repeated when the clocks go back, in file order, with a zone clock', async () => {
    // A logger on New Zealand daylight time: 01:30 … 02:45 NZDT, then 02:00 … 02:45 again in NZST, then 03:00.
    const stamps = ['01:30', '01:45', '02:00', '02:15', '02:30', '02:45', '02:00', '02:15', '02:30', '02:45', '03:00'];
    const text = `a\nb\n${stamps.map((s, i) => `2026-04-05 ${s},${(0.5 + i / 100).toFixed(2)}`).join('\n')}\n`;
    const { series, rows } = await readLoggerFile(text, { ...base, clock: { kind: 'zone', timeZone: 'Pacific/Auckland' } });
    expect(rows.problems).toEqual([]);
    expect(series.duplicates).toEqual([]);
    // 01:30 NZDT (UTC+13) is 12:30 UTC on 4 April; every later stamp 15 minutes on.
    const start = Date.UTC(2026, 3, 4, 12, 30);
    expect(Array.from(series.time_ms)).toEqual(stamps.map((_, i) => start + i * 15 * MIN));
    expect(rows.repeatedHour).toEqual([{ fromLine: 9, toLine: 12 }]);
  });

  it('shows the repeated hour as repeated times and a backward step when read as standard time', async () => {
    const stamps = ['01:45', '02:00', '02:15', '02:00', '02:15', '02:30'];
    const text = `a\nb\n${stamps.map((s) => `2026-04-05 ${s},0.5`).join('\n')}\n`;
    const { series, rows } = await readLoggerFile(text, base);
    expect(rows.backwardSteps).toEqual([{ line: 6, back_ms: 15 * MIN }]);
    expect(series.duplicates).toEqual([
      { line: 6, firstLine: 4, time_ms: Date.UTC(2026, 3, 4, 14) },
      { line: 7, firstLine: 5, time_ms: Date.UTC(2026, 3, 4, 14, 15) },
    ]);
    expect(series.time_ms.length).toBe(4);
  });

  it('reports a stamp inside the hour skipped when the clocks go forward', async () => {
    const text = 'a\nb\n2026-09-27 01:45,0.5\n2026-09-27 02:30,0.5\n2026-09-27 03:00,0.5\n';
    const { series, rows } = await readLoggerFile(text, { ...base, clock: { kind: 'zone', timeZone: 'Pacific/Auckland' } });
    expect(rows.problems).toHaveLength(1);
    expect(rows.problems[0].line).toBe(4);
    expect(rows.problems[0].message).toMatch(/does not exist in Pacific\/Auckland/);
    // 01:45 NZST = 13:45 UTC; 03:00 NZDT = 14:00 UTC on 26 September.
    expect(Array.from(series.time_ms)).toEqual([Date.UTC(2026, 8, 26, 13, 45), Date.UTC(2026, 8, 26, 14)]);
  });

  it('reports a line with too few fields and an impossible date', async () => {
    const text = 'a\nb\n2026-03-01 00:00\n2026-02-30 00:00,0.5\n';
    const { rows } = await readLoggerFile(text, base);
    expect(rows.problems.map((p) => p.line)).toEqual([3, 4]);
    expect(rows.problems[0].message).toMatch(/Line 3 has 1 field; the mapping needs 2/);
    expect(rows.problems[1].message).toMatch(/not a real date/);
  });

  it('refuses a mapping without a clock: it must be asked, never guessed', async () => {
    const { clock: _c, ...noClock } = base;
    await expect(readLoggerFile('x', noClock as LoggerMapping)).rejects.toThrow(/never guessed/);
  });

  it('stops when the signal is aborted', async () => {
    const lines = Array.from({ length: 5000 }, (_, i) => `2026-03-01 00:00:${String(i % 60).padStart(2, '0')},0.5`);
    const ac = new AbortController();
    ac.abort();
    await expect(readLoggerFile(`a\nb\n${lines.join('\n')}`, base, { signal: ac.signal, chunkChars: 1000 })).rejects.toThrow(/stopped/);
  });
});

describe('preview', () => {
  it('splits the first lines and finds the separator', () => {
    const p = previewLogger('Datum;Pegel\n01.03.2026 10:00;51,2\n01.03.2026 10:15;51,8\n', 2);
    expect(p.delimiter).toBe(';');
    expect(p.rows).toEqual([['Datum', 'Pegel'], ['01.03.2026 10:00', '51,2']]);
    const q = previewLogger('Date,Level\n2026-03-01 10:00,0.512\n2026-03-01 10:15,0.518\n');
    expect(q.delimiter).toBe(',');
  });
});

describe('missing hours', () => {
  it('shows the hour lost when a daylight-saving logger is read as standard time (a 75-minute step among 15-minute ones)', async () => {
    // A New Zealand logger on daylight time across 27 September 2026: 01:30, 01:45, then 03:00, 03:15 NZDT.
    const text = 'a\nb\n2026-09-27 01:30,0.5\n2026-09-27 01:45,0.5\n2026-09-27 03:00,0.5\n2026-09-27 03:15,0.5\n';
    const { series } = await readLoggerFile(text, base);
    expect(usualStep_ms(series.time_ms)).toBe(15 * MIN);
    expect(loggerGaps(series.time_ms, series.line)).toEqual([
      { afterLine: 4, beforeLine: 5, from_ms: Date.UTC(2026, 8, 26, 13, 45), to_ms: Date.UTC(2026, 8, 26, 15) },
    ]);
    // Read with the zone's clock the same stamps are 15 minutes apart throughout: no hole.
    const zoned = await readLoggerFile(text, { ...base, clock: { kind: 'zone', timeZone: 'Pacific/Auckland' } });
    expect(loggerGaps(zoned.series.time_ms, zoned.series.line)).toEqual([]);
  });
});

describe('stamps (Gregorian calendar rules, ISO 8601 offsets)', () => {
  it.each([
    ['2028-02-29 00:00', 'year-month-day', Date.UTC(2028, 1, 29)], // 2028 is a leap year
    ['2000-02-29T12:00', 'year-month-day', Date.UTC(2000, 1, 29, 12)], // divisible by 400: leap
    ['2026-12-31 23:59:59', 'year-month-day', Date.UTC(2026, 11, 31, 23, 59, 59)],
    ['2026/03/01 07:05:09.25', 'year-month-day', Date.UTC(2026, 2, 1, 7, 5, 9, 250)],
    ['31.12.2026 06:00', 'day-month-year', Date.UTC(2026, 11, 31, 6)],
    ['12/31/2026 06:00', 'month-day-year', Date.UTC(2026, 11, 31, 6)],
    ['2026-03-01', 'year-month-day', Date.UTC(2026, 2, 1)],
  ] as const)('%s (%s)', (text, format, naive) => {
    expect(parseStamp(text, format)).toEqual({ naive_ms: naive });
  });
  it.each([
    ['1900-02-29 00:00', 'year-month-day', /not a real date/], // divisible by 100, not 400: not leap
    ['2026-02-29 00:00', 'year-month-day', /not a real date/],
    ['2026-03-01 24:00', 'year-month-day', /not a real date/],
    ['01/03/26 10:00', 'day-month-year', /not a time written as day\/month\/year/],
    ['2026-03-01 10:00+15:00', 'year-month-day', /impossible UTC offset/],
  ] as const)('refuses %s', (text, format, message) => {
    expect(parseStamp(text, format)).toMatch(message);
  });
  it('reads offsets east and west', () => {
    expect(parseStamp('2026-03-01T10:00:00-0530', 'year-month-day')).toEqual({ naive_ms: Date.UTC(2026, 2, 1, 10), offset_min: -330 });
  });
});
