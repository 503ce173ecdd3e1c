// One home for calendar arithmetic (core/time/civil.ts) and for a gauging's deviation
// (core/rating/gauging-check.ts): a second copy that appears elsewhere fails the source checks, and the
// logger stamps, the CSV import and core/time agree on dates Date.UTC gets wrong (years 0–99).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseIsoWithOffset, parseStamp, utcOfCivil } from '../../core';
import { ROOT, sources } from '../support/store-writes';
import { parseTableCsv } from '../../web/screens/Ratings/table-csv';

const CODE = [...sources('core'), ...sources('web'), ...sources('office'), ...sources('sw')];
/** "file:line" of every line of the code (outside `home`) that matches. */
function linesMatching(re: RegExp, homes: readonly string[]): string[] {
  return CODE.filter((f) => !homes.includes(f)).flatMap((f) =>
    readFileSync(join(ROOT, f), 'utf8').split('\n').flatMap((line, i) => (re.test(line) ? [`${f}:${i + 1}`] : [])),
  );
}

describe('calendar arithmetic', () => {
  it('lives in core/time/civil.ts only: no Date.UTC, setUTCFullYear or leap-year rule elsewhere', () => {
    expect(linesMatching(/Date\.UTC\(|setUTCFullYear|%\s*400\b|\b(?:CUMULATIVE_DAYS|DAYS)\s*=\s*\[/, ['core/time/civil.ts'])).toEqual([]);
  });

  it('the logger stamps and the CSV import read a year 0070 date as core/time does (Date.UTC would say 1970)', () => {
    // Proleptic Gregorian calendar (ISO 8601 §3.2.1): 0070-03-01 is day 1 of March in year 70.
    expect(parseStamp('0070-03-01 00:00', 'year-month-day')).toEqual({ naive_ms: utcOfCivil(70, 3, 1) });
    expect(parseIsoWithOffset('0070-03-01T00:00:00Z')).toBe(utcOfCivil(70, 3, 1));
    expect(utcOfCivil(70, 3, 1)).toBeLessThan(0);
    // 2100 is not a leap year, 2000 is (Gregorian rule).
    expect(typeof parseStamp('2100-02-29 00:00', 'year-month-day')).toBe('string');
    expect(parseIsoWithOffset('2000-02-29T12:00:00+12:00')).toBe(utcOfCivil(2000, 2, 29, 0));
  });
});

describe('reading CSV', () => {
  it('has two readers: core/exchange/csv-read.ts for whole texts, papaparse only in the streaming logger reader', () => {
    expect(linesMatching(/from 'papaparse'/, ['web/logger/read-logger.ts'])).toEqual([]);
    // The mark of a hand-written splitter: looking ahead for a doubled quote (RFC 4180 §2 rule 7).
    expect(linesMatching(/\[\w+ \+ 1\] === '"'/, ['core/exchange/csv-read.ts'])).toEqual([]);
  });

  it("the rating-table import reads quoted fields by core's reader (RFC 4180 §2 rules 5-7) and names the line", () => {
    // A quoted discharge with a decimal comma holds the delimiter; an open quote is refused with its line.
    const table = parseTableCsv('stage (m),discharge (m3/s)\n0.5,"1,5"\n0.6,2.5\n0.7,"3.5"\n', 'metric');
    expect(table.rows.map((r) => r.discharge_m3s)).toEqual([1.5, 2.5, 3.5]);
    expect(() => parseTableCsv('stage,discharge\n0.5,1\n0.6,"2\n', 'metric')).toThrow(/^Line 3: /);
  });
});

describe("a gauging's deviation", () => {
  it('is worked out in core/rating/gauging-check.ts only (checksRating is called nowhere else)', () => {
    expect(linesMatching(/\bchecksRating\(/, ['core/rating/grade.ts', 'core/rating/gauging-check.ts'])).toEqual([]);
  });
});
