/** Least-squares line ln Q = lnC + b·ln(h − e) for one offset, and its log-space sum of squared residuals. */
export interface LogLine {
  lnCoefficient: number;
  exponent: number;
  /** Σ (ln Q_i − lnC − b·ln(h_i − e))², dimensionless. */
  sse: number;
}

/**
 * Closed-form least squares in log space for a fixed offset_m (m), which must be below every stage:
 * x_i = ln(h_i − e), y_i = ln Q_i (lnQ given), b = Sxy/Sxx, lnC = ȳ − b·x̄. Needs two distinct stages.
 * `x` is scratch space of the same length, so a search over offsets allocates nothing per trial.
 */
export function logLineAt(stage_m: Float64Array, lnQ: Float64Array, offset_m: number, x: Float64Array): LogLine {
  const n = stage_m.length;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    const xi = Math.log(stage_m[i] - offset_m);
    x[i] = xi;
    sx += xi;
    sy += lnQ[i];
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - mx;
    sxx += dx * dx;
    sxy += dx * (lnQ[i] - my);
  }
  const b = sxy / sxx;
  // Summing the residuals directly (not Syy − b·Sxy) keeps the tiny sums of exact data accurate,
  // which the offset search needs to resolve its minimum.
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = lnQ[i] - my - b * (x[i] - mx);
    sse += r * r;
  }
  return { lnCoefficient: my - b * mx, exponent: b, sse };
}
