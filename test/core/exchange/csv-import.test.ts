// Readings from CSV: the record reader agrees with papaparse (a general-purpose CSV parser, test-only
// oracle) on RFC 4180 text; the import names the line of every problem and imports nothing then; our
// own export reads back exactly. Times: ISO 8601 with offset; units: NIST SP 811 (1 ft = 0.3048 m).
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  NO_DISCHARGE, CsvImportError, guessReadingsMapping, parseIsoWithOffset, parseReadingsCsv, readCsvRecords, readingsToCsv,
  type ReadingCsvMapping, type ReadingExportRow,
} from '../../../core';

const SITE = '5ea1c0de-0000-4000-8000-000000000001';
const base: ReadingCsvMapping = { delimiter: ',', headerLine: 1, time: 0, stage: 1, stageUnit: 'm', decimalComma: false, quality: 2, note: 3, source: 'staff', defaultQuality: 'good' };

function problems(fn: () => unknown): { line: number; message: string }[] {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(CsvImportError);
    return (e as CsvImportError).problems;
  }
  throw new Error('expected the import to be refused');
}

describe('readCsvRecords (papaparse as oracle)', () => {
  it('reads the same fields as papaparse for any table written with RFC 4180 quoting', () => {
    const cell = fc.oneof(fc.string(), fc.constantFrom('a,b', 'say "hi"', 'two\nlines', 'cr\r\nlf', '', ' ', ';', '\t'));
    fc.assert(fc.property(fc.array(fc.array(cell, { minLength: 2, maxLength: 4 }), { minLength: 1, maxLength: 5 }), fc.constantFrom(',', ';', '\t'), fc.constantFrom('\r\n', '\n'), (rows, delimiter, newline) => {
      const width = rows[0].length;
      const table = rows.map((r) => Array.from({ length: width }, (_, i) => r[i] ?? ''));
      const text = Papa.unparse(table, { delimiter, newline, quotes: (v: unknown) => /["\r\n,;\t]/.test(String(v)) || String(v) === '' });
      const oracle = Papa.parse<string[]>(text, { delimiter, newline }).data;
      expect(readCsvRecords(text, delimiter).map((r) => r.fields)).toEqual(oracle);
    }), { numRuns: 300 });
  });

  it('numbers records by the line they start on, past quoted line breaks', () => {
    const recs = readCsvRecords('\uFEFFa,b\r\n"x\r\ny",1\r\n\r\nz,2\n', ',');
    expect(recs.map((r) => r.line)).toEqual([1, 2, 4, 5]);
    expect(recs[0].fields).toEqual(['a', 'b']); // byte-order mark skipped
    expect(recs[1].fields).toEqual(['x\r\ny', '1']);
  });
});

describe('parseIsoWithOffset', () => {
  it.each([
    ['2026-12-01T10:15:00+13:00', Date.UTC(2026, 10, 30, 21, 15)],
    ['2026-06-01 10:15Z', Date.UTC(2026, 5, 1, 10, 15)],
    ['2026-03-29T01:30:00.25-0230', Date.UTC(2026, 2, 29, 4, 0, 0, 250)],
  ])('%s', (text, ms) => expect(parseIsoWithOffset(text)).toBe(ms));

  it('keeps the year 0070 as 70, not 1970 (issue 10 item 4)', () => {
    expect(new Date(parseIsoWithOffset('0070-01-01T00:00:00Z') as number).getUTCFullYear()).toBe(70);
  });

  it('refuses impossible dates and times without an offset, in words', () => {
    expect(parseIsoWithOffset('2026-02-29T10:00:00Z')).toMatch(/not a real date/); // 2026 is not a leap year
    expect(parseIsoWithOffset('2028-02-29T10:00:00Z')).toBe(Date.UTC(2028, 1, 29, 10));
    expect(parseIsoWithOffset('2026-12-01T10:15:00')).toMatch(/has no UTC offset/);
  });
});

describe('parseReadingsCsv', () => {
  it('reads back our own export exactly, hostile notes included', () => {
    const notes = ['=HYPERLINK("http://example.invalid","x")', '@obs', '-0.31 below the peg', 'plain, with "quotes"\nand a line break', ''];
    const rows: ReadingExportRow[] = notes.map((note, i) => ({
      reading: { id: `0b6f6a7e-1c2d-4e5f-8a9b-0c1d2e3f4a0${i}`, rev: '0001764547200000-000000-devA', updated_ms: 0, siteId: 'x', time_ms: Date.UTC(2026, 5, 30, 21, 15 + i), stage_m: [-0.31, 0.7341, 1.5, 0, 12.25][i], source: 'staff', quality: (['good', 'fair', 'poor', 'estimated', 'good'] as const)[i], observer: '', note, warnings: [] },
      discharge_m3s: NO_DISCHARGE, shift_m: 0, extrapolated: false,
    }));
    const csv = readingsToCsv(rows, { siteCode: '=XY', timeZone: 'America/Denver', units: 'metric' });
    const guess = guessReadingsMapping(csv);
    expect(guess.columns.slice(0, 3)).toEqual(['site', 'time', 'stage_m']);
    const mapping = { ...guess.mapping, time: guess.mapping.time!, stage: guess.mapping.stage! };
    expect(mapping).toMatchObject({ delimiter: ',', headerLine: 1, time: 1, stage: 2, stageUnit: 'm', quality: 7, note: 9 });
    const back = parseReadingsCsv(csv, mapping, SITE);
    expect(back).toEqual(rows.map((r) => ({ siteId: SITE, time_ms: r.reading.time_ms, stage_m: r.reading.stage_m, source: 'staff', quality: r.reading.quality, observer: '', note: r.reading.note, warnings: [] })));
  });

  it('reads a semicolon file with decimal commas, LF lines, a byte-order mark and no header; stage in feet', () => {
    const text = '\uFEFF2026-05-01T08:00:00+02:00;2,50\n2026-05-01T08:15:00+02:00;-0,31\n';
    const guess = guessReadingsMapping(text);
    expect(guess.mapping).toMatchObject({ delimiter: ';', headerLine: 0, time: 0, stage: 1, decimalComma: true });
    const out = parseReadingsCsv(text, { ...base, delimiter: ';', headerLine: 0, decimalComma: true, stageUnit: 'ft', quality: undefined, note: undefined }, SITE);
    expect(out.map((r) => r.stage_m)).toEqual([2.5 * 0.3048, -0.31 * 0.3048]); // NIST SP 811
    expect(out[0].time_ms).toBe(Date.UTC(2026, 4, 1, 6, 0));
    expect(out[0].quality).toBe('good');
  });

  it('names the line of every problem and imports nothing', () => {
    const text = [
      'time,stage,quality,note', // 1
      '2026-05-01T08:00:00Z,0.5,good,', // 2 fine
      '2026-05-01T08:15:00,0.5,good,', // 3 no offset
      '2026-05-01T08:30:00Z,1 2,good,', // 4 space inside a number (issue 10 item 7)
      '2026-05-01T08:45:00Z,high,good,', // 5 text in a number cell
      '2026-02-30T09:00:00Z,0.5,good,', // 6 no such day
      '2026-05-01T09:15:00Z,0.5,excellent,', // 7 unknown quality
      '"2026-05-01T09:30:00Z",0.5,good,"a', // 8 quote never closed: the file cannot be read on
    ].join('\r\n');
    const p = problems(() => parseReadingsCsv(text, base, SITE));
    expect(p).toEqual([{ line: 8, message: 'a quoted field is never closed (a " is missing)' }]);
    const fixed = text.replace(/"a$/, 'a');
    const q = problems(() => parseReadingsCsv(fixed, base, SITE));
    expect(q.map((x) => x.line)).toEqual([3, 4, 5, 6, 7]);
    expect(q[0].message).toMatch(/no UTC offset; add one/);
    expect(q[1].message).toBe('the stage "1 2" is not a number, e.g. 0.734');
    expect(q[3].message).toMatch(/not a real date/);
    expect(q[4].message).toMatch(/not one of good, fair, poor, estimated/);
  });

  it('refuses a truncated last line and an absurd stage, and skips blank lines', () => {
    const text = 'time,stage,quality,note\n2026-05-01T08:00:00Z,0.5,good,ok\n\n2026-05-01T08:15:00Z,120000,good,x\n2026-05-01T08:30:00Z';
    const p = problems(() => parseReadingsCsv(text, base, SITE));
    expect(p).toEqual([
      { line: 4, message: 'the stage 120000 m is beyond ±1000 m; is the unit right?' },
      { line: 5, message: 'expected at least 4 columns; found 1 (is the separator right, or is the line cut short?)' },
    ]);
    const cm = parseReadingsCsv('2026-05-01T08:00:00Z,73.4\n', { ...base, headerLine: 0, stageUnit: 'cm', quality: undefined, note: undefined }, SITE);
    expect(cm[0].stage_m).toBeCloseTo(0.734, 12);
  });

  // The text rule (core/records/text.ts): U+0000 and U+001F are Unicode controls (Cc); U+D800 alone is half
  // of a UTF-16 pair (Unicode §3.9 D91; RFC 8259 §8.2); U+1F30A as its pair D83C DF0A is a character.
  it('refuses a note holding NUL, U+001F or a lone surrogate, naming line and character; keeps pairs and CR LF', () => {
    const text = 'time,stage,quality,note\n2026-05-01T08:00:00Z,0.5,good,"logger export \u0000\u0000 junk"\n' +
      '2026-05-01T08:15:00Z,0.6,good,a\u001fb\n2026-05-01T08:30:00Z,0.7,good,half \ud800\n' +
      '2026-05-01T08:45:00Z,0.8,good,"wave \ud83c\udf0a\r\nsecond line"\n';
    const p = problems(() => parseReadingsCsv(text, base, SITE));
    expect(p).toEqual([
      { line: 2, message: 'the note holds a NUL character (U+0000) at character 15, which Freshet does not store; remove it from the file and import again' },
      { line: 3, message: 'the note holds a control character (U+001F) at character 2, which Freshet does not store; remove it from the file and import again' },
      { line: 4, message: 'the note holds half of a character pair with its other half missing (U+D800) at character 6, which Freshet does not store; remove it from the file and import again' },
    ]);
    const ok = parseReadingsCsv('time,stage,quality,note\n2026-05-01T08:45:00Z,0.8,good,"wave \ud83c\udf0a\r\nsecond line"\n', base, SITE);
    expect(ok[0].note).toBe('wave \ud83c\udf0a\nsecond line');
  });
});
