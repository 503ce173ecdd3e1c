// Key-point handles: square targets of 44 CSS px (WCAG 2.1 success criterion 2.5.5, target size) that
// never overlap and stay inside the plotting area. Overlap is rectangle intersection worked out here; the
// sideways spread is checked against the exact least-squares answer for two and three crowded targets
// (worked by hand: equal weights, so a pooled group keeps its mean) and on random layouts (fast-check).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { HANDLE_PX, placeHandles, type HandleArea } from '../../web/screens/Storm/handle-layout';

// The storm screen's plotting area at 360 px: about 284 px wide, 126 px high (170 px plot, 44 px time axis).
const storm: HandleArea = { left: 52, top: 0, width: 284, height: 126 };
const tall: HandleArea = { left: 52, top: 0, width: 290, height: 220 };

type Rect = { l: number; r: number; t: number; b: number };
const rect = (s: { x: number; y: number }): Rect => ({ l: s.x - HANDLE_PX / 2, r: s.x + HANDLE_PX / 2, t: s.y - HANDLE_PX / 2, b: s.y + HANDLE_PX / 2 });
const intersect = (a: Rect, b: Rect) => a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b;
const inside = (a: Rect, area: HandleArea) =>
  a.l >= area.left - 1e-9 && a.r <= area.left + area.width + 1e-9 && a.t >= area.top - 1e-9 && a.b <= area.top + area.height + 1e-9;

describe('placing the key-point handles', () => {
  it('leaves every target on its point when none would overlap', () => {
    const wishes = [{ key: 'R', x: 80, y: 100 }, { key: 'P', x: 150, y: 30 }, { key: 'I', x: 230, y: 60 }, { key: 'E', x: 300, y: 100 }];
    expect(placeHandles(wishes, storm).map((s) => [s.x, s.y])).toEqual(wishes.map((w) => [w.x, w.y]));
  });

  it('stacks P and I when their centres are 30 px apart (issue 24)', () => {
    const spots = placeHandles([{ key: 'R', x: 80, y: 100 }, { key: 'P', x: 150, y: 30 }, { key: 'I', x: 180, y: 50 }, { key: 'E', x: 300, y: 100 }], storm);
    const [r, p, i, e] = spots;
    expect(intersect(rect(p), rect(i))).toBe(false);
    // Stacked in their column, each at its own time: least squares would move both 14 px apart from their
    // mean height (P to 16, I to 64), but P's target stops at the top edge (22), so I goes 48 below it.
    expect([p.x, p.y, p.pointY]).toEqual([150, 22, 30]);
    expect([i.x, i.y, i.pointX, i.pointY]).toEqual([180, 70, 180, 50]);
    expect([r.x, r.y, e.x, e.y]).toEqual([80, 100, 300, 100]);
  });

  it('keeps a peak at the very top wholly inside the area, its point where it is', () => {
    const [p] = placeHandles([{ key: 'P', x: 150, y: 2 }], storm);
    expect(rect(p).t).toBe(storm.top);
    expect(p.pointY).toBe(2);
  });

  it('puts the target of a point with no value on the bottom edge', () => {
    const [e] = placeHandles([{ key: 'E', x: 150, y: Number.NaN }], storm);
    expect(rect(e).b).toBe(storm.top + storm.height);
    expect(e.pointY).toBe(storm.top + storm.height);
  });

  it('spreads two targets at one height apart by the least total movement: half each way', () => {
    // Least squares with one gap constraint: both move (48 − 20) / 2 = 14 px, the mean (160) kept.
    const spots = placeHandles([{ key: 'A', x: 150, y: 63 }, { key: 'B', x: 170, y: 63 }], { left: 52, top: 0, width: 284, height: 60 });
    expect(spots.map((s) => s.x)).toEqual([136, 184]);
  });

  it('spreads three crowded targets sideways when a column would not fit the height', () => {
    // 3 × 48 − 4 = 140 px of column in a 126 px area: side by side instead, about their mean 160 (least
    // squares: 112, 160, 208), each at its own point's height.
    const spots = placeHandles([{ key: 'R', x: 150, y: 110 }, { key: 'P', x: 160, y: 10 }, { key: 'I', x: 170, y: 60 }], storm);
    expect(spots.map((s) => s.x)).toEqual([112, 160, 208]);
    expect(spots.map((s) => s.y)).toEqual([104, 22, 60]);
    expect(spots.map((s) => s.pointX)).toEqual([150, 160, 170]);
  });

  it('moves only the two that overlap when a stack would hit a third: R and E stay on their points', () => {
    // P and I 11 px apart: stacked, I (at 70) would meet R (at 104, 33 px to the left), and three do not fit
    // 126 px. Side by side instead, P and I alone, about their mean x 179.5 (least squares): 155.5 and 203.5.
    const spots = placeHandles([{ key: 'R', x: 152, y: 124 }, { key: 'P', x: 174, y: 5 }, { key: 'I', x: 185, y: 50 }, { key: 'E', x: 264, y: 124 }], storm);
    expect(spots.map((s) => [s.x, s.y])).toEqual([[152, 104], [155.5, 22], [203.5, 50], [264, 104]]);
  });

  it('keeps the spread inside the area at its right edge', () => {
    const spots = placeHandles([{ key: 'R', x: 330, y: 60 }, { key: 'P', x: 333, y: 62 }, { key: 'I', x: 335, y: 64 }, { key: 'E', x: 336, y: 66 }], storm);
    expect(rect(spots[3]).r).toBeCloseTo(storm.left + storm.width, 9);
    for (let k = 1; k < 4; k++) expect(spots[k].x - spots[k - 1].x).toBeCloseTo(HANDLE_PX + 4, 9);
  });

  it.each([['the storm screen’s 284 × 126 px area', storm], ['a 290 × 220 px area', tall]])('never overlaps and never leaves %s, wherever four points fall', (_name, area) => {
    const x = fc.double({ min: area.left - 10, max: area.left + area.width + 10, noNaN: true });
    const y = fc.oneof(fc.double({ min: area.top - 30, max: area.top + area.height + 30, noNaN: true }), fc.constant(Number.NaN));
    fc.assert(
      fc.property(fc.array(fc.tuple(x, y), { minLength: 1, maxLength: 4 }), (pts) => {
        pts.sort((a, b) => a[0] - b[0]);
        const spots = placeHandles(pts.map(([px, py], k) => ({ key: `k${k}`, x: px, y: py })), area);
        for (let a = 0; a < spots.length; a++) {
          expect(inside(rect(spots[a]), area)).toBe(true);
          for (let b = a + 1; b < spots.length; b++) expect(intersect(rect(spots[a]), rect(spots[b]))).toBe(false);
        }
      }),
      { numRuns: 2000 },
    );
  });
});
