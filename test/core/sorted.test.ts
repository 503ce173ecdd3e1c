// The one binary search, checked against its definition read literally: a linear scan for the first index
// whose value is ≥ x (or > x), over random sorted arrays with repeats (fast-check, with the run’s printed seed).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sortedIndex } from '../../core/index';

function linear(t: readonly number[], x: number, after: boolean, lo: number, hi: number): number {
  for (let i = lo; i < hi; i++) if (after ? t[i] > x : t[i] >= x) return i;
  return hi;
}

describe('sortedIndex', () => {
  it('is the first index at or after x (before or after equal values), within [lo, hi)', () => {
    const sorted = fc.array(fc.integer({ min: -20, max: 20 }), { maxLength: 40 }).map((a) => a.sort((p, q) => p - q));
    fc.assert(
      fc.property(sorted, fc.integer({ min: -25, max: 25 }), fc.boolean(), fc.nat(), fc.nat(), (t, x, after, a, b) => {
        const lo = t.length === 0 ? 0 : a % (t.length + 1);
        const hi = lo + (t.length - lo === 0 ? 0 : b % (t.length - lo + 1));
        expect(sortedIndex(t, x, after, lo, hi)).toBe(linear(t, x, after, lo, hi));
      }),
      { numRuns: 500 },
    );
  });

  it('places equal values exactly (exact cases)', () => {
    const t = [1, 2, 2, 2, 5];
    expect(sortedIndex(t, 2)).toBe(1);
    expect(sortedIndex(t, 2, true)).toBe(4);
    expect(sortedIndex(t, 0)).toBe(0);
    expect(sortedIndex(t, 9)).toBe(5);
  });
});
