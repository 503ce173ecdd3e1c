// Time-axis labels at spans from an hour to years, in the site's zone. Two outside references: the
// Gregorian calendar (the dates written out by hand below, e.g. 2 Dec 2026 is the day after 1 Dec) and
// Node's Intl.DateTimeFormat with the IANA zone database, which gives the wall time of each tick
// independently of core's zone code (Europe/London is UTC+0 in winter; Pacific/Auckland UTC+13 in its
// summer; America/New_York UTC−5 in winter, UTC−4 in summer).
import { describe, expect, it } from 'vitest';
import { tickGrain, timeTickLabels } from '../../web/components/Plot/time-axis';

const MIN = 60_000;
const HOUR = 60 * MIN;
const DAY = 24 * HOUR;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** The wall time of t in the zone by Intl (the oracle), as numbers. */
function intlWall(t: number, timeZone: string) {
  const f = new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: '2-digit', minute: '2-digit', second: '2-digit' });
  const get = (type: string) => Number(f.formatToParts(new Date(t)).find((p) => p.type === type)?.value);
  return { year: get('year'), month: get('month'), day: get('day'), hour: get('hour'), minute: get('minute'), second: get('second') };
}

describe('tick grain by step', () => {
  it('picks seconds, clock, days, months, years', () => {
    expect(tickGrain(15_000)).toBe('second');
    expect(tickGrain(15 * MIN)).toBe('minute');
    expect(tickGrain(6 * HOUR)).toBe('minute');
    // A day with a daylight-saving change is 23 h long (IANA zone rules): still a day.
    expect(tickGrain(23 * HOUR)).toBe('day');
    expect(tickGrain(7 * DAY)).toBe('day');
    // February is 28 days (Gregorian calendar, a common year): still a month.
    expect(tickGrain(28 * DAY)).toBe('month');
    expect(tickGrain(365 * DAY)).toBe('year');
  });
});

describe('labels at several spans, checked against the calendar', () => {
  it('one hour on 2 Dec in London: the clock every 15 minutes, the date once', () => {
    // 2 Dec 2026 09:00 in London is 09:00 UTC (GMT in winter).
    const ticks = [0, 1, 2, 3, 4].map((k) => Date.UTC(2026, 11, 2, 9) + k * 15 * MIN);
    expect(timeTickLabels(ticks, 15 * MIN, 'Europe/London')).toEqual(['09:00\n2 Dec', '09:15', '09:30', '09:45', '10:00']);
  });
  it('a day of readings on 2 Dec never reads "1 Jan"', () => {
    const ticks = [0, 1, 2, 3, 4].map((k) => Date.UTC(2026, 11, 2) + k * 6 * HOUR);
    const labels = timeTickLabels(ticks, 6 * HOUR, 'Europe/London');
    expect(labels).toEqual(['00:00\n2 Dec', '06:00', '12:00', '18:00', '00:00\n3 Dec']);
    expect(labels.join(' ')).not.toContain('Jan');
  });
  it('a week across the new year in Auckland: days, with the year under the first and under 1 Jan', () => {
    // Midnight 30 Dec 2026 in Auckland (UTC+13) is 11:00 UTC on 29 Dec.
    const ticks = [0, 1, 2, 3].map((k) => Date.UTC(2026, 11, 29, 11) + k * DAY);
    expect(timeTickLabels(ticks, DAY, 'Pacific/Auckland')).toEqual(['30 Dec\n2026', '31 Dec', '1 Jan\n2027', '2 Jan']);
  });
  it('months over a year in New York: month names, the year where it changes', () => {
    // Midnight on the 1st of Nov 2026 … Feb 2027 in New York (UTC−4 on 1 Nov before the change that
    // day at 02:00, UTC−5 after).
    const ticks = [Date.UTC(2026, 10, 1, 4), Date.UTC(2026, 11, 1, 5), Date.UTC(2027, 0, 1, 5), Date.UTC(2027, 1, 1, 5)];
    expect(timeTickLabels(ticks, 30 * DAY, 'America/New_York')).toEqual(['Nov\n2026', 'Dec', 'Jan\n2027', 'Feb']);
  });
  it('years over a decade: the year alone', () => {
    const ticks = [2024, 2026, 2028].map((y) => Date.UTC(y, 0, 1));
    expect(timeTickLabels(ticks, 2 * 365 * DAY, 'UTC')).toEqual(['2024', '2026', '2028']);
  });
  it('seconds when the ticks are under a minute apart', () => {
    const ticks = [0, 1, 2].map((k) => Date.UTC(2026, 11, 2, 9, 0, 0) + k * 20_000);
    expect(timeTickLabels(ticks, 20_000, 'UTC')).toEqual(['09:00:00\n2 Dec', '09:00:20', '09:00:40']);
  });
  it('a gap in the splits is an empty label, not "NaN"', () => {
    expect(timeTickLabels([Date.UTC(2026, 11, 2), Number.NaN], HOUR, 'UTC')).toEqual(['00:00\n2 Dec', '']);
  });
});

describe('labels at every span agree with Intl in several zones', () => {
  const zones = ['UTC', 'Europe/London', 'Pacific/Auckland', 'America/New_York', 'Asia/Kolkata'];
  const spans: [string, number][] = [['1 h', 10 * MIN], ['1 d', 3 * HOUR], ['10 d', DAY], ['1 y', 30 * DAY], ['10 y', 365 * DAY]];
  for (const zone of zones) {
    for (const [name, step] of spans) {
      it(`${name} in ${zone}`, () => {
        const start = Date.UTC(2026, 2, 27, 13, 10);
        const ticks = Array.from({ length: 6 }, (_, k) => start + k * step);
        const labels = timeTickLabels(ticks, step, zone);
        ticks.forEach((t, i) => {
          const w = intlWall(t, zone);
          const first = labels[i].split('\n')[0];
          const pad = (n: number) => String(n).padStart(2, '0');
          const want = step >= 360 * DAY ? String(w.year) : step >= 28 * DAY ? MONTHS[w.month - 1] : step >= 23 * HOUR ? `${w.day} ${MONTHS[w.month - 1]}` : `${pad(w.hour)}:${pad(w.minute)}`;
          expect(first).toBe(want);
        });
        // The coarse line appears on the first tick (except for years, which need none).
        if (step < 360 * DAY) expect(labels[0]).toContain('\n');
      });
    }
  }
});
