// The plot's zoom/pan arithmetic and its own time labels. Expected values are exact arithmetic (anchor
// stays put, span scales by the factor) and the zone rules of the IANA time-zone database as Node's Intl
// applies them (Pacific/Auckland is UTC+13 in December, daylight time; UTC+12 in June).
import { describe, expect, it } from 'vitest';
import { clampRange, panBy, pinchRange, zoomAbout } from '../../web/components/Plot/view-range';
import { clockLabel, dayLabel, numberTickLabel, timeTickLabels } from '../../web/components/Plot/time-axis';

const extent = { min: 0, max: 1000 };

describe('zoom and pan of the x range', () => {
  it('zooms about an anchor that keeps its place on screen', () => {
    const r = zoomAbout({ min: 100, max: 500 }, 200, 2, extent, 1);
    expect(r).toEqual({ min: 150, max: 350 });
    // The anchor is a quarter of the way across before and after.
    expect((200 - r.min) / (r.max - r.min)).toBeCloseTo(0.25, 12);
  });
  it('never zooms closer than the minimum span, nor out beyond the data', () => {
    expect(zoomAbout({ min: 100, max: 110 }, 105, 100, extent, 4)).toEqual({ min: 103, max: 107 });
    expect(zoomAbout({ min: 100, max: 500 }, 300, 0.1, extent, 4)).toEqual(extent);
  });
  it('pans by a delta and stops at either end of the data', () => {
    expect(panBy({ min: 100, max: 300 }, 50, extent)).toEqual({ min: 150, max: 350 });
    expect(panBy({ min: 100, max: 300 }, -500, extent)).toEqual({ min: 0, max: 200 });
    expect(panBy({ min: 100, max: 300 }, 5000, extent)).toEqual({ min: 800, max: 1000 });
  });
  it('pinches: twice the finger distance halves the span about the first midpoint', () => {
    // 300 px wide showing 0–600: the midpoint at 150 px is x = 300; fingers spread from 100 px to 200 px apart.
    const r = pinchRange({ min: 0, max: 600 }, 150, 100, 150, 200, 300, extent, 1);
    expect(r).toEqual({ min: 150, max: 450 });
    // Moving the midpoint 60 px right (a fifth of the width) with the same spread moves the view left by a fifth of its span.
    expect(pinchRange({ min: 0, max: 600 }, 150, 100, 210, 200, 300, extent, 1)).toEqual({ min: 90, max: 390 });
  });
  it('clamps a range wider than the data to the data', () => {
    expect(clampRange({ min: -5, max: 2000 }, extent)).toEqual(extent);
  });
});

describe('time labels in the site zone, 24-hour', () => {
  // 2026-12-03 01:30 UTC is 14:30 on 3 Dec in Auckland (UTC+13 in summer).
  const t = Date.UTC(2026, 11, 3, 1, 30);
  it('shows the clock and day in the zone', () => {
    expect(clockLabel(t, 'Pacific/Auckland')).toBe('14:30');
    expect(dayLabel(t, 'Pacific/Auckland')).toBe('3 Dec');
    expect(clockLabel(t, 'UTC')).toBe('01:30');
    // In June Auckland is UTC+12.
    expect(clockLabel(Date.UTC(2026, 5, 3, 1, 30), 'Pacific/Auckland')).toBe('13:30');
  });
  it('puts the date under the first tick and under each new day, and dates alone for daily ticks', () => {
    const six_h = 6 * 3_600_000;
    const ticks = [0, 1, 2, 3].map((k) => Date.UTC(2026, 11, 3, 5) + k * six_h); // 18:00, 00:00, 06:00, 12:00 Auckland
    expect(timeTickLabels(ticks, six_h, 'Pacific/Auckland')).toEqual(['18:00\n3 Dec', '00:00\n4 Dec', '06:00', '12:00']);
    expect(timeTickLabels([Date.UTC(2026, 11, 3, 11), Date.UTC(2026, 11, 4, 11)], 86_400_000, 'Pacific/Auckland')).toEqual(['4 Dec\n2026', '5 Dec']);
  });
  it('labels numbers with the decimals their spacing needs', () => {
    expect(numberTickLabel(2.5, 0.5)).toBe('2.5');
    expect(numberTickLabel(2, 0.5)).toBe('2.0');
    expect(numberTickLabel(7.5, 2.5)).toBe('7.5');
    expect(numberTickLabel(0.05, 0.01)).toBe('0.05');
    expect(numberTickLabel(12000, 2000)).toBe('12,000');
    expect(numberTickLabel(0, 0.5)).toBe('0');
  });
});
