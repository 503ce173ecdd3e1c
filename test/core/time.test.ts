// Wall-clock times in a site's zone. Offsets and change dates follow the IANA tz database; the US
// dates follow the Energy Policy Act of 2005 (DST from the second Sunday in March to the first Sunday
// in November, at 02:00 local).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromLocalInput, instantOf, toIsoWithOffset, toLocalInput, wallTimeAt, zoneOffset_min } from '../../core';

describe('zone offsets (IANA tz database)', () => {
  it.each([
    ['Pacific/Auckland', Date.UTC(2026, 11, 1, 0, 0), 13 * 60], // NZDT in December
    ['Pacific/Auckland', Date.UTC(2026, 6, 1, 0, 0), 12 * 60], // NZST in July
    ['America/New_York', Date.UTC(2026, 0, 15, 12), -5 * 60], // EST
    ['America/New_York', Date.UTC(2026, 6, 15, 12), -4 * 60], // EDT
    ['Asia/Kolkata', Date.UTC(2026, 3, 1), 5 * 60 + 30], // IST, half-hour offset, no DST
    ['UTC', Date.UTC(2026, 3, 1), 0],
  ])('%s at %d is %d minutes east', (zone, t, off) => {
    expect(zoneOffset_min(t, zone)).toBe(off);
  });
});

describe('entering times', () => {
  it('reads a wall time in the zone', () => {
    // 10:15 NZDT on 1 Dec 2026 is 21:15 UTC on 30 Nov.
    expect(fromLocalInput('2026-12-01T10:15', 'Pacific/Auckland')).toBe(Date.UTC(2026, 10, 30, 21, 15));
    expect(toLocalInput(Date.UTC(2026, 10, 30, 21, 15), 'Pacific/Auckland')).toBe('2026-12-01T10:15');
    expect(toIsoWithOffset(Date.UTC(2026, 10, 30, 21, 15), 'Pacific/Auckland')).toBe('2026-12-01T10:15:00+13:00');
    expect(toIsoWithOffset(Date.UTC(2026, 0, 2, 3, 4, 5), 'America/New_York')).toBe('2026-01-01T22:04:05-05:00');
  });

  it('handles the spring gap and the autumn overlap (US 2026: 8 March and 1 November)', () => {
    // 02:30 on 8 March 2026 does not exist in New York: refused, naming 03:30 EDT and 01:30 EST (issue 10 item 4).
    expect(() => fromLocalInput('2026-03-08T02:30', 'America/New_York')).toThrow(/does not exist in America\/New_York.*03:30.*01:30/);
    // 01:30 on 1 November 2026 happens twice; the earlier (EDT, 05:30 UTC) is taken.
    expect(fromLocalInput('2026-11-01T01:30', 'America/New_York')).toBe(Date.UTC(2026, 10, 1, 5, 30));
  });

  it('round-trips every minute-aligned instant through the wall clock', () => {
    const zones = ['Pacific/Auckland', 'America/New_York', 'Europe/London', 'Asia/Kolkata', 'Australia/Adelaide'];
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 60 * 24 * 366 * 3 }), fc.constantFrom(...zones), (minutes, zone) => {
        const t = Date.UTC(2025, 0, 1) + minutes * 60_000;
        const w = wallTimeAt(t, zone);
        const back = instantOf(w, zone);
        // In an overlap the earlier instant is returned, which shows the same wall time.
        expect(toLocalInput(back, zone)).toBe(toLocalInput(t, zone));
        expect(back).toBeLessThanOrEqual(t);
        expect(t - back).toBeLessThanOrEqual(60 * 60_000);
      }),
      { numRuns: 400 },
    );
  });

  it('refuses what is not a date and time, naming what is expected', () => {
    expect(() => fromLocalInput('yesterday', 'UTC')).toThrow(/YYYY-MM-DD HH:mm/);
    expect(() => fromLocalInput('2026-13-01T00:00', 'UTC')).toThrow(RangeError);
    expect(() => fromLocalInput('2026-01-01T00:00', 'Mars/Olympus')).toThrow(/Unknown time zone/);
    expect(() => wallTimeAt(Number.NaN, 'UTC')).toThrow(RangeError);
  });
});
