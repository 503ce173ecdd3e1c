// φ-index: the constant loss rate that leaves exactly the observed runoff depth as rainfall excess.

/** φ-index result: loss rate (mm/h), rainfall excess per interval (mm) and the excess duration (h). */
export interface PhiIndexResult {
  phi_mm_per_h: number;
  excess_mm: Float64Array;
  excessDuration_h: number;
}

/** Solves Σ max(P_j − φ·Δt, 0) = R for φ (mm/h) from interval rainfall depths P_j (mm), Δt (h) and runoff R (mm). */
export function phiIndex(rainfall_mm: ArrayLike<number>, step_h: number, runoffDepth_mm: number): PhiIndexResult {
  const fn = 'phiIndex';
  if (!rainfall_mm || rainfall_mm.length === 0) throw new RangeError(`${fn} needs at least one rainfall interval; got none`);
  if (typeof step_h !== 'number' || !Number.isFinite(step_h) || !(step_h > 0)) {
    throw new RangeError(`${fn} needs step_h above 0; got ${String(step_h)}`);
  }
  let total = 0;
  for (let j = 0; j < rainfall_mm.length; j++) {
    const p = rainfall_mm[j];
    if (!Number.isFinite(p) || p < 0) throw new RangeError(`${fn} needs rainfall ≥ 0 mm in every interval; interval ${j} is ${p}`);
    total += p;
  }
  if (!Number.isFinite(runoffDepth_mm) || runoffDepth_mm <= 0 || runoffDepth_mm > total) {
    throw new RangeError(`${fn} needs a runoff depth above 0 and at most the rainfall (${total} mm); got ${runoffDepth_mm} mm`);
  }
  const sorted = Float64Array.from(rainfall_mm).sort().reverse();
  let loss = 0;
  let sum = 0;
  for (let m = 1; m <= sorted.length; m++) {
    sum += sorted[m - 1];
    loss = (sum - runoffDepth_mm) / m;
    const nextDepth = m < sorted.length ? sorted[m] : 0;
    if (loss >= nextDepth && loss <= sorted[m - 1]) break;
  }
  const excess_mm = new Float64Array(rainfall_mm.length);
  let intervals = 0;
  for (let j = 0; j < rainfall_mm.length; j++) {
    excess_mm[j] = Math.max(0, rainfall_mm[j] - loss);
    if (excess_mm[j] > 0) intervals++;
  }
  return { phi_mm_per_h: loss / step_h, excess_mm, excessDuration_h: intervals * step_h };
}
