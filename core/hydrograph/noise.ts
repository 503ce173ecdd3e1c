// A record's own noise level, and a light running-mean smoothing, for tolerances that scale to the record.

/** Most differences a median is taken over by default; longer records are sampled at an even stride (the median barely moves). */
export const MEDIAN_SAMPLE = 1 << 14;

/** 0.6745·√6: the median absolute second difference of white noise of standard deviation σ is σ times this. */
const SECOND_DIFFERENCE_SCALE = 0.6745 * Math.sqrt(6);

/**
 * Noise σ (m³/s) of a discharge record: the median absolute second difference Q_{i+1} − 2Q_i + Q_{i−1},
 * divided by 0.6745·√6 (robust-statistics practice, DOMAIN.md §4). Triples touching a bridged reading
 * (`missing[i]` = 1) are left out. 0 when fewer than 3 readings remain. Records longer than `sample`
 * differences are sampled at an even stride.
 */
export function noiseSigma(q: ArrayLike<number>, missing?: Uint8Array, sample = MEDIAN_SAMPLE): number {
  const first = 0;
  const last = q.length - 1;
  const count = last - first - 1;
  if (count < 1) return 0;
  const stride = Math.max(1, Math.ceil(count / sample));
  const d = new Float64Array(Math.ceil(count / stride));
  let m = 0;
  for (let i = first + 1; i < last; i += stride) {
    if (missing !== undefined && (missing[i - 1] | missing[i] | missing[i + 1])) continue;
    d[m++] = Math.abs(q[i + 1] - 2 * q[i] + q[i - 1]);
  }
  return m === 0 ? 0 : median(d.subarray(0, m)) / SECOND_DIFFERENCE_SCALE;
}

/** Median absolute change (m³/s) from one reading to the next, readings touching a bridged one left out. */
export function medianStepChange(q: ArrayLike<number>, missing?: Uint8Array, sample = MEDIAN_SAMPLE): number {
  const count = q.length - 1;
  if (count < 1) return 0;
  const stride = Math.max(1, Math.ceil(count / sample));
  const d = new Float64Array(Math.ceil(count / stride));
  let m = 0;
  for (let i = 0; i < count; i += stride) {
    if (missing !== undefined && (missing[i] | missing[i + 1])) continue;
    d[m++] = Math.abs(q[i + 1] - q[i]);
  }
  return m === 0 ? 0 : median(d.subarray(0, m));
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
