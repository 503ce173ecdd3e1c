// The fast ISO 8601 formatter against core/time's toIsoWithOffset (Intl time-zone data, IANA tz database)
// at every instant tested, including the hours either side of clock changes.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isoWithOffsetFormatter, toIsoWithOffset } from '../../../core';

const ZONES = ['Pacific/Auckland', 'America/Denver', 'Europe/London', 'Australia/Lord_Howe', 'Asia/Kathmandu', 'America/St_Johns', 'UTC'];

// The oracle asks Intl for every instant: slow on a busy machine, so a longer timeout.
describe('isoWithOffsetFormatter', { timeout: 90_000 }, () => {
  it.each(ZONES)('matches toIsoWithOffset every 71 minutes through 2026 in %s', (zone) => {
    const iso = isoWithOffsetFormatter(zone);
    // Lord Howe moves by 30 minutes, Kathmandu is +05:45, St John's −03:30/−02:30: odd offsets and steps.
    for (let t = Date.UTC(2026, 0, 1); t < Date.UTC(2027, 0, 1); t += 71 * 60_000 + 13_000) expect(iso(t)).toBe(toIsoWithOffset(t, zone));
  });

  it('matches at random instants 1900–2100, seconds kept, fractions dropped', () => {
    fc.assert(fc.property(fc.constantFrom(...ZONES), fc.array(fc.integer({ min: Date.UTC(1900, 0, 1), max: Date.UTC(2100, 0, 1) }), { minLength: 1, maxLength: 20 }), (zone, times) => {
      const iso = isoWithOffsetFormatter(zone);
      for (const t of times) expect(iso(t)).toBe(toIsoWithOffset(t, zone));
    }), { numRuns: 200 });
  });

  it('names the autumn repeated hour by its two offsets (NZ, 5 April 2026: 03:00 NZDT → 02:00 NZST)', () => {
    const iso = isoWithOffsetFormatter('Pacific/Auckland');
    expect(iso(Date.UTC(2026, 3, 4, 13, 30))).toBe('2026-04-05T02:30:00+13:00');
    expect(iso(Date.UTC(2026, 3, 4, 14, 30))).toBe('2026-04-05T02:30:00+12:00');
  });
});
