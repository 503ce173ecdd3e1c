// A record's own noise level, and a light running-mean smoothing, for tolerances that scale to the record.

/** Most differences a median is taken over by default; longer records are sampled at an even stride (the median barely moves). */
export const MEDIAN_SAMPLE = 1 << 14;

/** 0.6745·√6: the median absolute second difference of white noise of standard deviation σ is σ times this. */
const SECOND_DIFFERENCE_SCALE = 0.6745 * Math.sqrt(6);

/**
 * Absolute differences of a record at an even stride, taken while a pass over the record goes by (so each
 * value is read from cache): order 2 gives second differences |Q_{i+1} − 2Q_i + Q_{i−1}| at i = 1, 1 + s, …;
 * order 1 gives step changes |Q_{i+1} − Q_i| at i = 0, s, …; the stride s keeps at most `sample` of them.
 * Differences touching a bridged reading (`missing[i]` = 1) are left out.
 */
export class StridedDifferences {
  private readonly values: Float64Array;
  private readonly stride: number;
  private readonly end: number;
  private next: number;
  private count = 0;

  constructor(
    private readonly q: ArrayLike<number>,
    private readonly order: 1 | 2,
    private readonly missing?: Uint8Array,
    sample = MEDIAN_SAMPLE,
  ) {
    const available = q.length - order;
    this.end = available < 1 ? 0 : q.length - 1;
    this.stride = Math.max(1, Math.ceil(available / sample));
    this.values = new Float64Array(available < 1 ? 0 : Math.ceil(available / this.stride));
    this.next = order - 1;
  }

  /** Takes the differences at indices below upTo (those already taken are kept). */
  takeBelow(upTo: number): void {
    const { q, missing, stride, values } = this;
    const stop = Math.min(upTo, this.end);
    let i = this.next;
    let m = this.count;
    if (this.order === 2) {
      for (; i < stop; i += stride) {
        if (missing !== undefined && (missing[i - 1] | missing[i] | missing[i + 1])) continue;
        values[m++] = Math.abs(q[i + 1] - 2 * q[i] + q[i - 1]);
      }
    } else {
      for (; i < stop; i += stride) {
        if (missing !== undefined && (missing[i] | missing[i + 1])) continue;
        values[m++] = Math.abs(q[i + 1] - q[i]);
      }
    }
    this.next = i;
    this.count = m;
  }

  /** The median of the differences taken (0 when none; reorders them). */
  median(): number {
    return this.count === 0 ? 0 : median(this.values.subarray(0, this.count));
  }
}

/** Noise σ (m³/s) from second differences (StridedDifferences of order 2): their median over 0.6745·√6. */
export function sigmaOfSecondDifferences(d: StridedDifferences): number {
  return d.median() / SECOND_DIFFERENCE_SCALE;
}

/**
 * Noise σ (m³/s) of a discharge record: the median absolute second difference Q_{i+1} − 2Q_i + Q_{i−1},
 * divided by 0.6745·√6 (robust-statistics practice, DOMAIN.md §4). Triples touching a bridged reading
 * (`missing[i]` = 1) are left out. 0 when fewer than 3 readings remain. Records longer than `sample`
 * differences are sampled at an even stride.
 */
export function noiseSigma(q: ArrayLike<number>, missing?: Uint8Array, sample = MEDIAN_SAMPLE): number {
  const d = new StridedDifferences(q, 2, missing, sample);
  d.takeBelow(q.length);
  return sigmaOfSecondDifferences(d);
}

/** Median absolute change (m³/s) from one reading to the next, readings touching a bridged one left out. */
export function medianStepChange(q: ArrayLike<number>, missing?: Uint8Array, sample = MEDIAN_SAMPLE): number {
  const d = new StridedDifferences(q, 1, missing, sample);
  d.takeBelow(q.length);
  return d.median();
}

/** Median of the values (reorders the array in place): quickselect, linear on average, no full sort. */
function median(values: Float64Array): number {
  const k = values.length >> 1;
  const upper = select(values, k);
  if (values.length % 2 === 1) return upper;
  let lower = values[0];
  for (let i = 1; i < k; i++) if (values[i] > lower) lower = values[i];
  return 0.5 * (lower + upper);
}

/** The k-th smallest value (0-based), leaving smaller values before index k (Hoare partition, middle pivot). */
function select(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const x = a[i];
        a[i] = a[j];
        a[j] = x;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k];
  }
  return a[k];
}

/** Centred running mean (m³/s) over 2·half + 1 readings, the window shortened symmetrically at the ends. */
export function runningMean(q: Float64Array, half: number): Float64Array {
  const n = q.length;
  const out = new Float64Array(n);
  if (half < 1) {
    out.set(q);
    return out;
  }
  const sums = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) sums[i + 1] = sums[i] + q[i];
  for (let i = 0; i < n; i++) {
    const w = Math.min(half, i, n - 1 - i);
    out[i] = (sums[i + w + 1] - sums[i - w]) / (2 * w + 1);
  }
  return out;
}
