// Readings as CSV: RFC 4180 quoting, read back by papaparse (a general-purpose CSV parser, test-only
// oracle); times as ISO 8601 with the site's offset (IANA tz database); units converted with the exact
// NIST SP 811 factors.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvDocument, csvField, readingsToCsv, type ReadingExportRow } from '../../core';

const reading = (over: Partial<ReadingExportRow['reading']> = {}): ReadingExportRow['reading'] => ({
  id: '0b6f6a7e-1c2d-4e5f-8a9b-0c1d2e3f4a5b', rev: '0001764547200000-0000-devA', updated_ms: 0,
  siteId: 'site', time_ms: Date.UTC(2026, 10, 30, 21, 15), stage_m: 0.734, source: 'staff', quality: 'good',
  observer: 'K. Ferris', note: '', warnings: [], ...over,
});

describe('RFC 4180 fields', () => {
  it.each([
    ['plain', 'plain'],
    ['a,b', '"a,b"'], // §2 rule 6: a comma means quotes
    ['say "hi"', '"say ""hi"""'], // §2 rule 7: quotes doubled inside quotes
    ['two\nlines', '"two\nlines"'], // §2 rule 6: a line break means quotes
    ['', ''],
  ])('%j → %j', (raw, quoted) => expect(csvField(raw)).toBe(quoted));

  it('ends every record with CRLF (§2 rules 1–2)', () => {
    expect(csvDocument([['a', 'b'], ['1', '2']])).toBe('a,b\r\n1,2\r\n');
  });
});

describe('readingsToCsv', () => {
  const rows: ReadingExportRow[] = [
    { reading: reading(), discharge_m3s: 1.5, shift_m: 0, extrapolated: false },
    {
      reading: reading({ time_ms: Date.UTC(2026, 11, 1, 3, 0), stage_m: 1.9, note: 'debris, "large" log\nat the control', warnings: ['Outside the gauged range.'], gps: { lat: -41.5, lon: 174.25, accuracy_m: 8, time_ms: 0 } }),
      discharge_m3s: 9.87654321, shift_m: -0.01, extrapolated: true,
    },
    { reading: reading({ time_ms: Date.UTC(2026, 11, 1, 4, 0) }), discharge_m3s: Number.NaN, shift_m: 0, extrapolated: false },
  ];

  it('reads back field for field with a general CSV parser, in metric', () => {
    const csv = readingsToCsv(rows, { siteCode: 'XY-1', timeZone: 'Pacific/Auckland', units: 'metric' });
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toContain('stage_m');
    expect(parsed.meta.fields).toContain('discharge_m³/s');
    const [a, b, c] = parsed.data;
    expect(a.time).toBe('2026-12-01T10:15:00+13:00'); // NZDT, tz database
    expect(a.stage_m).toBe('0.7340');
    expect(a['discharge_m³/s']).toBe('1.5');
    expect(b.note).toBe('debris, "large" log\nat the control');
    expect(b.extrapolated).toBe('yes');
    expect(b['discharge_m³/s']).toBe('9.88'); // three significant figures, what a rating supports (common practice)
    expect(b.shift_m).toBe('-0.0100');
    expect(b.latitude_deg).toBe('-41.5');
    expect(c['discharge_m³/s']).toBe(''); // no rating: empty, never NaN
    expect(csv).not.toMatch(/NaN|undefined/);
  });

  it('writes US customary units with the exact factors', () => {
    const csv = readingsToCsv(rows.slice(0, 1), { siteCode: 'XY-1', timeZone: 'America/Denver', units: 'us' });
    const [row] = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true }).data;
    expect(row.stage_ft).toBe((0.734 / 0.3048).toFixed(3)); // NIST SP 811: 1 ft = 0.3048 m
    expect(row['discharge_ft³/s']).toBe('53'); // 1.5 / 0.028316846592 = 52.97 // 1 ft³/s = 0.028316846592 m³/s (NIST SP 811), three significant figures
    expect(row.time).toBe('2026-11-30T14:15:00-07:00'); // MST
  });
});
