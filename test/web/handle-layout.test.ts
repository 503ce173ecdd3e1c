// Key-point handles: squares of 44 CSS px (WCAG 2.1 success criterion 2.5.5, target size) never overlap
// and stay inside the plotting area. Checked by rectangle intersection worked out here, on the case from
// issue 24 (P and I 30 px apart) and on random layouts (fast-check).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { HANDLE_PX, placeHandles } from '../../web/screens/Storm/handle-layout';

const tall = { left: 52, top: 0, width: 290, height: 220 };
// The storm screen's plot: 170 px high with a 44 px time axis under its area.
const short = { left: 52, top: 0, width: 290, height: 126 };
let area = tall;
const box = (s: { x: number; y: number }) => ({ l: s.x - HANDLE_PX / 2, r: s.x + HANDLE_PX / 2, t: s.y - HANDLE_PX / 2, b: s.y + HANDLE_PX / 2 });
const overlaps = (a: ReturnType<typeof box>, b: ReturnType<typeof box>) => a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b;
const inside = (a: ReturnType<typeof box>) => a.l >= area.left - HANDLE_PX / 2 && a.r <= area.left + area.width + HANDLE_PX / 2 && a.t >= area.top - 1e-9 && a.b <= area.top + area.height + 1e-9;

describe('placing the key-point handles', () => {
  it('moves I off P when their centres are 30 px apart, keeping P on its point', () => {
    const spots = placeHandles([{ key: 'R', x: 80, y: 200 }, { key: 'P', x: 150, y: 40 }, { key: 'I', x: 180, y: 60 }, { key: 'E', x: 300, y: 190 }], area);
    const p = spots.find((s) => s.key === 'P')!;
    const i = spots.find((s) => s.key === 'I')!;
    expect(p).toMatchObject({ x: 150, y: 40, pointY: 40 });
    expect(overlaps(box(p), box(i))).toBe(false);
    expect(i.x).toBe(180);
    expect(i.pointY).toBe(60);
  });
  it('keeps a peak at the very top wholly inside the area (not clipped)', () => {
    const [p] = placeHandles([{ key: 'P', x: 150, y: 3 }], area);
    expect(box(p).t).toBe(area.top);
    expect(p.pointY).toBe(area.top + HANDLE_PX / 2);
  });
  it('puts a point with no value on the bottom row', () => {
    const [e] = placeHandles([{ key: 'E', x: 150, y: Number.NaN }], area);
    expect(box(e).b).toBe(area.top + area.height);
  });
  it('spreads sideways when a stack would not fit, keeping the targets whole and apart', () => {
    area = short;
    const spots = placeHandles([{ key: 'R', x: 150, y: 100 }, { key: 'P', x: 160, y: 10 }, { key: 'I', x: 170, y: 30 }], short);
    expect(spots.map((s) => s.x)).toEqual([150, 198, 246]);
    expect(spots.map((s) => s.pointX)).toEqual([150, 160, 170]);
    area = tall;
  });
  it.each([['a 220 px area', tall], ['the storm screen’s 126 px area', short]])('never overlaps and never leaves %s, wherever four points fall', (_name, a) => {
    area = a;
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 52, max: 342, noNaN: true }), fc.double({ min: -20, max: a.height + 20, noNaN: true })), { minLength: 4, maxLength: 4 }), (pts) => {
        const spots = placeHandles(pts.map(([x, y], k) => ({ key: `k${k}`, x, y })), area);
        for (let a = 0; a < spots.length; a++) {
          expect(inside(box(spots[a]))).toBe(true);
          for (let b = a + 1; b < spots.length; b++) expect(overlaps(box(spots[a]), box(spots[b]))).toBe(false);
        }
      }),
      { seed: 2412, numRuns: 500 },
    );
  });
});
