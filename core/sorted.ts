// Searching a sorted array of numbers: the one binary search the stage record, storm finding, local fits
// and the phone's series reads share.

/**
 * First index i in [lo, hi) of t (ascending) with t[i] ≥ x, or t[i] > x when `after`; hi when there is none.
 * With `after` false it is where x would go before equal values; with `after` true, after them.
 */
export function sortedIndex(t: ArrayLike<number>, x: number, after = false, lo = 0, hi = t.length): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] < x || (after && t[mid] === x)) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
