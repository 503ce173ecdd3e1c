// A record's own noise level, and a light running-mean smoothing, for tolerances that scale to the record.

/** Most differences a median is taken over; longer records are sampled at an even stride (the median barely moves). */
const MEDIAN_SAMPLE = 1 << 15;

/** 0.6745·√6: the median absolute second difference of white noise of standard deviation σ is σ times this. */
const SECOND_DIFFERENCE_SCALE = 0.6745 * Math.sqrt(6);

/**
 * Noise σ (m³/s) of a discharge record: the median absolute second difference Q_{i+1} − 2Q_i + Q_{i−1},
 * divided by 0.6745·√6 (robust-statistics practice, DOMAIN.md §4). Triples touching a bridged reading
 * (`missing[i]` = 1) are left out. 0 when fewer than 3 readings remain.
 */
export function noiseSigma(q: ArrayLike<number>, missing?: Uint8Array, first = 0, last = q.length - 1): number {
  const count = last - first - 1;
  if (count < 1) return 0;
  const stride = Math.max(1, Math.ceil(count / MEDIAN_SAMPLE));
  const d = new Float64Array(Math.ceil(count / stride));
  let m = 0;
  for (let i = first + 1; i < last; i += stride) {
    if (missing !== undefined && (missing[i - 1] | missing[i] | missing[i + 1])) continue;
    d[m++] = Math.abs(q[i + 1] - 2 * q[i] + q[i - 1]);
  }
  return m === 0 ? 0 : median(d.subarray(0, m)) / SECOND_DIFFERENCE_SCALE;
}

/** Median absolute change (m³/s) from one reading to the next, readings touching a bridged one left out. */
export function medianStepChange(q: ArrayLike<number>, missing?: Uint8Array): number {
  const count = q.length - 1;
  if (count < 1) return 0;
  const stride = Math.max(1, Math.ceil(count / MEDIAN_SAMPLE));
  const d = new Float64Array(Math.ceil(count / stride));
  let m = 0;
  for (let i = 0; i < count; i += stride) {
    if (missing !== undefined && (missing[i] | missing[i + 1])) continue;
    d[m++] = Math.abs(q[i + 1] - q[i]);
  }
  return m === 0 ? 0 : median(d.subarray(0, m));
}

/** Median of the values (sorts the array in place). */
function median(values: Float64Array): number {
  values.sort();
  const k = values.length >> 1;
  return values.length % 2 === 1 ? values[k] : 0.5 * (values[k - 1] + values[k]);
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
