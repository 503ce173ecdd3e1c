// Messages a user sees never hold internal names or raw milliseconds (issue 10 item 11). The table holds
// real messages: thrown by the core's validators and calculations here, and the ones quoted in the issue.
import { describe, expect, it } from 'vitest';
import { fromLocalInput, RecordValidationError, separateBaseflow, validateReadingBody, validateSiteBody } from '../../core';
import { StorageError } from '../../web/db/errors';
import { locationProblem, plainError } from '../../web/plain-words';

// Independent of the implementation's own pattern: snake_case names, camelCase names, 11+ digit counts, "ms".
const LEAK = /\b\w+_\w+\b|\b[a-z]+[A-Z]\w*\b|\d{11,}|\bms\b|epoch|milliseconds|RangeError|NaN|undefined/;

const reading = { siteId: 's1', time_ms: Date.UTC(2026, 0, 1), stage_m: 0.5, source: 'staff', quality: 'good', observer: '', note: '', warnings: [] };
const site = { code: 'PB-03', name: 'Pellow Burn', timeZone: 'Europe/Oslo', displayUnits: 'metric', jumpLimit_m: 0.3 };
function thrown(fn: () => unknown): unknown {
  try {
    fn();
  } catch (e) {
    return e;
  }
  throw new Error('expected a throw');
}

const series = { time_ms: Float64Array.from([0, 1, 2, 3, 4].map((h) => Date.UTC(2026, 0, 1, h))), discharge_m3s: Float64Array.from([1, 3, 5, 3, 1]) };

describe('plainError over real messages', () => {
  it.each([
    // [what, error, expected sentence (or pattern)]
    ['a fractional time', thrown(() => validateReadingBody({ ...reading, time_ms: 1.5 })), 'The time must be a date and time from 1970 onwards; check the year.'],
    ['a time before 1970 (year 0070 typed)', thrown(() => validateReadingBody({ ...reading, time_ms: fromLocalInput('0070-06-01T10:00', 'UTC') })), 'The time must be a date and time from 1970 onwards; check the year.'],
    ['a stage of 1e23 m', thrown(() => validateReadingBody({ ...reading, stage_m: 1e23 })), 'The stage must be a number from −1,000 to 1,000 m.'],
    ['a stage of 1e23 m at a US-units site', thrown(() => validateReadingBody({ ...reading, stage_m: 1e23 })), 'The stage must be a number from −3,280.84 to 3,280.84 ft.', 'us'],
    ['a long observer', thrown(() => validateReadingBody({ ...reading, observer: 'x'.repeat(300) })), 'The observer must be at most 200 characters long.'],
    ['a GPS accuracy below 0', thrown(() => validateReadingBody({ ...reading, gps: { lat: 1, lon: 1, accuracy_m: -1, time_ms: 0 } })), 'The location accuracy must be a number of at least 0 m.'],
    ['a site area of 0', thrown(() => validateSiteBody({ ...site, area_km2: 0 })), /^The catchment area must be a number (above 0|from)/],
    ['a site area of 1e23 km²', thrown(() => validateSiteBody({ ...site, area_km2: 1e23 })), 'The catchment area must be a number above 0 and at most 10,000,000 km².'],
    ['a jump limit of 0', thrown(() => validateSiteBody({ ...site, jumpLimit_m: 0 })), /^The jump limit must be a number/],
    ['a datum elevation of 20 km', thrown(() => validateSiteBody({ ...site, datum: { description: '', elevation_m: 20_000 } })), /^The datum elevation must be a number from −/],
    // The text rule (core/records/text.ts): U+0000 is NUL, a Unicode control (Cc).
    ['a NUL in a note', thrown(() => validateReadingBody({ ...reading, note: 'logger export \u0000 junk' })), 'The note holds a NUL character (U+0000) at character 15; remove it (tab and new line are fine).'],
    ['a lone U+D800 in a site name', thrown(() => validateSiteBody({ ...site, name: 'Pellow \ud800' })), 'The site name holds half of a character pair with its other half missing (U+D800) at character 8; remove it (tab and new line are fine).'],
    ['an unknown zone', thrown(() => validateSiteBody({ ...site, timeZone: 'Mars/Olympus' })), 'The time zone must be a time zone from the list.'],
    ['the issue\'s time_ms message', new RecordValidationError('reading', 'time_ms', 'a whole number of UTC epoch milliseconds from 0 to 8.64e15', -1), 'The time must be a date and time from 1970 onwards; check the year.'],
    ['key points out of order', thrown(() => separateBaseflow(series, { kind: 'straight-line' }, { points: { riseStart_ms: series.time_ms[2], peak_ms: series.time_ms[1], inflection_ms: series.time_ms[3], runoffEnd_ms: series.time_ms[4] } })), /^The baseflow separation needs key points in order .* the peak \(2026-01-01 01:00\) is before the rise start \(2026-01-01 02:00\)\.$/],
    ['the issue\'s separateBaseflow message', new RangeError('separateBaseflow needs key points in order rise start ≤ peak ≤ inflection ≤ end of runoff'), 'The baseflow separation needs key points in order rise start ≤ peak ≤ inflection ≤ end of runoff.'],
    ['a checkReading time', new RangeError('checkReading needs a finite time in UTC ms; got NaN'), /^This could not be worked out|^The reading check needs a finite time/],
    ['a key point outside the series', new RangeError('summarizeEvent needs from_ms and to_ms inside the series (1767225600000–1767240000000 ms)'), 'The storm summary needs the start of the window and the end of the window inside the series (2026-01-01 00:00–2026-01-01 04:00).'],
  ] as [string, unknown, string | RegExp, ('metric' | 'us')?][])('%s', (_what, err, expected, units) => {
    const text = plainError(err, { units: units ?? 'metric', timeZone: 'UTC' });
    expect(text).not.toMatch(LEAK);
    if (typeof expected === 'string') expect(text).toBe(expected);
    else expect(text).toMatch(expected);
  });

  it('never leaks, whatever the core says (fallback sentence)', () => {
    // A name the tables do not know stays internal, so the whole sentence is replaced.
    const text = plainError(new RangeError('someStep needs widget_count_x above 0; got 1767225600000'));
    expect(text).not.toMatch(LEAK);
    expect(text).toMatch(/could not be worked out/);
  });

  it('does not say "Saving failed" for a read', () => {
    const unknown = new StorageError('unknown', 'x');
    expect(plainError(unknown, { doing: 'read' })).toMatch(/could not read/);
    expect(plainError(unknown, { doing: 'read' })).not.toMatch(/sav/i);
    expect(plainError(new StorageError('quota', 'The phone has no room left'), { doing: 'save' })).toBe('The phone has no room left');
  });
});

describe('location refusals in the app\'s words', () => {
  it.each([
    [1, /^Location is off for this app\./], // PERMISSION_DENIED (W3C Geolocation API)
    [2, /could not find its location/], // POSITION_UNAVAILABLE
    [3, /took too long/], // TIMEOUT
  ])('code %d', (code, expected) => {
    expect(locationProblem({ code })).toMatch(expected);
  });
});
