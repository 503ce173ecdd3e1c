// Typed times that are skipped, repeated or impossible (issue 10 item 4): reported, never shifted.
// Change dates are facts of the IANA tz database (files `europe`, `northamerica`, `australasia`, read
// through the platform's Intl data): the EU rule (last Sunday of March 01:00 UTC forward, last Sunday of
// October 01:00 UTC back; Directive 2000/84/EC), the US rule (second Sunday of March 02:00 forward,
// first Sunday of November 02:00 back; Energy Policy Act of 2005), New Zealand (last Sunday of September
// 02:00 forward, first Sunday of April 03:00 back; NZ Daylight Time Order 2007), Lord Howe Island
// (half-hour change, first Sunday of October 02:00 → 02:30) and Samoa skipping 30 December 2011.
import { describe, expect, it } from 'vitest';
import { daysFromCivil, fromLocalInput, readLocalInput, toIsoWithOffset, toLocalInput, utcOfCivil } from '../../core';

const H = 3_600_000;

describe('a wall time the clocks skipped is a gap with both readings', () => {
  it.each([
    // zone, typed, [earlier candidate UTC, later candidate UTC]
    ['Europe/Oslo', '2026-03-29T02:30', [Date.UTC(2026, 2, 29, 0, 30), Date.UTC(2026, 2, 29, 1, 30)]], // CEST +2 / CET +1
    ['America/New_York', '2026-03-08T02:30', [Date.UTC(2026, 2, 8, 6, 30), Date.UTC(2026, 2, 8, 7, 30)]], // EDT −4 / EST −5
    ['Pacific/Auckland', '2026-09-27T02:30', [Date.UTC(2026, 8, 26, 13, 30), Date.UTC(2026, 8, 26, 14, 30)]], // NZDT +13 / NZST +12
    ['Australia/Lord_Howe', '2026-10-04T02:15', [Date.UTC(2026, 9, 3, 15, 15), Date.UTC(2026, 9, 3, 15, 45)]], // +11 / +10:30
    ['Pacific/Apia', '2011-12-30T12:00', [Date.UTC(2011, 11, 29, 22, 0), Date.UTC(2011, 11, 30, 22, 0)]], // +14 / −10: the whole day skipped
  ] as const)('%s %s', (zone, typed, [a, b]) => {
    expect(readLocalInput(typed, zone)).toEqual({ kind: 'gap', candidates_ms: [a, b] });
    // Neither candidate shows the typed time: each is a real time either side of the change.
    expect(toLocalInput(a, zone)).not.toBe(typed);
    expect(toLocalInput(b, zone)).not.toBe(typed);
    expect(() => fromLocalInput(typed, zone)).toThrow(/does not exist/);
  });

  it('names both clock times in the refusal, in plain words', () => {
    expect(() => fromLocalInput('2026-03-29T02:30', 'Europe/Oslo')).toThrow(
      '2026-03-29 02:30 does not exist in Europe/Oslo: the clocks went forward at that hour. Did you mean 03:30 (on a watch not yet put forward) or 01:30?',
    );
  });
});

describe('a wall time the clocks repeated has two instants, earlier first', () => {
  it.each([
    ['Europe/Oslo', '2026-10-25T02:30', [Date.UTC(2026, 9, 25, 0, 30), Date.UTC(2026, 9, 25, 1, 30)], ['+02:00', '+01:00']],
    ['America/New_York', '2026-11-01T01:30', [Date.UTC(2026, 10, 1, 5, 30), Date.UTC(2026, 10, 1, 6, 30)], ['-04:00', '-05:00']],
    ['Pacific/Auckland', '2026-04-05T02:30', [Date.UTC(2026, 3, 4, 13, 30), Date.UTC(2026, 3, 4, 14, 30)], ['+13:00', '+12:00']],
  ] as const)('%s %s', (zone, typed, [a, b], [offA, offB]) => {
    expect(readLocalInput(typed, zone)).toEqual({ kind: 'repeated', candidates_ms: [a, b] });
    expect(b - a).toBe(H);
    expect(toIsoWithOffset(a, zone)).toBe(`${typed}:00${offA}`);
    expect(toIsoWithOffset(b, zone)).toBe(`${typed}:00${offB}`);
  });

  it('gives one instant either side of the changes', () => {
    expect(readLocalInput('2026-03-29T01:59', 'Europe/Oslo')).toEqual({ kind: 'one', time_ms: Date.UTC(2026, 2, 29, 0, 59) });
    expect(readLocalInput('2026-03-29T03:00', 'Europe/Oslo')).toEqual({ kind: 'one', time_ms: Date.UTC(2026, 2, 29, 1, 0) });
    expect(readLocalInput('2026-10-25T03:00', 'Europe/Oslo')).toEqual({ kind: 'one', time_ms: Date.UTC(2026, 9, 25, 2, 0) });
    expect(readLocalInput('2026-10-25T01:59', 'Europe/Oslo')).toEqual({ kind: 'one', time_ms: Date.UTC(2026, 9, 24, 23, 59) });
  });
});

describe('years and dates are read as typed', () => {
  it('keeps years 0001–0099 (no 1900 added)', () => {
    // Checked against Date's own setUTCFullYear, which (unlike Date.UTC) does not remap years 0–99.
    const d = new Date(0);
    d.setUTCFullYear(70, 0, 1);
    expect(fromLocalInput('0070-01-01T00:00', 'UTC')).toBe(d.getTime());
    expect(fromLocalInput('0070-01-01T00:00', 'UTC')).not.toBe(Date.UTC(1970, 0, 1));
    expect(toLocalInput(fromLocalInput('0099-12-31T23:59', 'UTC'), 'UTC')).toBe('0099-12-31T23:59');
  });

  it('counts days like the platform calendar for every year 1–9999 (proleptic Gregorian)', () => {
    for (let y = 1; y <= 9999; y += 37) {
      const d = new Date(0);
      d.setUTCFullYear(y, 2, 1);
      expect(utcOfCivil(y, 3, 1)).toBe(d.getTime());
    }
    expect(daysFromCivil(1970, 1, 1)).toBe(0);
    expect(daysFromCivil(2000, 3, 1)).toBe(11017); // from memory, checked by Date.UTC(2000, 2, 1) / 86400000
    expect(daysFromCivil(2000, 3, 1) * 86_400_000).toBe(Date.UTC(2000, 2, 1));
  });

  it.each([
    ['2026-02-31T10:00', /February 2026 has 28 days/],
    ['2026-02-29T10:00', /February 2026 has 28 days/],
    ['2026-04-31T10:00', /April 2026 has 30 days/],
    ['1900-02-29T10:00', /February 1900 has 28 days/], // a century year that is not a leap year
    ['0000-01-01T10:00', /year 0000/],
    ['2026-13-01T00:00', /month must be 01 to 12/],
    ['2026-01-01T24:00', /real time of day/],
    ['31/12/2026 10:00', /YYYY-MM-DD HH:mm/],
  ])('refuses %s', (typed, why) => {
    expect(() => fromLocalInput(typed, 'Europe/Oslo')).toThrow(why);
    expect(() => readLocalInput(typed, 'Europe/Oslo')).toThrow(RangeError);
  });

  it('accepts 29 February in a leap year (2028, 2000)', () => {
    expect(fromLocalInput('2028-02-29T10:00', 'UTC')).toBe(Date.UTC(2028, 1, 29, 10));
    expect(fromLocalInput('2000-02-29T10:00', 'UTC')).toBe(Date.UTC(2000, 1, 29, 10));
  });
});
