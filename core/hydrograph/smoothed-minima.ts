// Smoothed-minima baseflow (Institute of Hydrology 1980; Gustard et al. 1992, IH Report 108).
import { MS_PER_DAY } from './series';
import { joinAnchors } from './anchors';
import { defaultSmoothedMinima } from './methods';

/** Block minima and the turning points chosen among them (indices into the record). */
export interface SmoothedMinimaDetail {
  baseflow: Float64Array;
  blockMinima: number[];
  turningPoints: number[];
}

/**
 * Baseflow (m³/s) of a regular record of daily (or coarser) flows: minima of non-overlapping blocks; a block
 * minimum is a turning point when factor × it is at or below both neighbouring block minima; baseflow is
 * linear between turning points, held level before the first and after the last, and capped at Q.
 * window_days (the record's length in days) is only for the message when the record is too short.
 */
export function smoothedMinima(
  t: Float64Array,
  q: Float64Array,
  step_ms: number,
  block_days: number = defaultSmoothedMinima.block_days,
  factor: number = defaultSmoothedMinima.factor,
  window_days: number = (q.length * step_ms) / MS_PER_DAY,
): SmoothedMinimaDetail {
  const block = Math.max(1, Math.round((block_days * MS_PER_DAY) / step_ms));
  const blocks = Math.floor(q.length / block);
  if (blocks < 3) {
    const blockDays = Number(((block * step_ms) / MS_PER_DAY).toPrecision(6));
    const has = Math.floor(window_days * 10 + 1e-9) / 10;
    throw new RangeError(
      `Smoothed minima needs at least ${Number((3 * blockDays).toPrecision(6))} days of flows (three ${blockDays}-day blocks); ` +
        `this window has ${has} days. Widen the window.`,
    );
  }
  const blockMinima: number[] = [];
  for (let k = 0; k < blocks; k++) {
    let at = k * block;
    for (let i = at + 1; i < (k + 1) * block; i++) if (q[i] < q[at]) at = i;
    blockMinima.push(at);
  }
  const turningPoints: number[] = [];
  for (let k = 1; k < blocks - 1; k++) {
    const v = factor * q[blockMinima[k]];
    if (v <= q[blockMinima[k - 1]] && v <= q[blockMinima[k + 1]]) turningPoints.push(blockMinima[k]);
  }
  if (turningPoints.length === 0) {
    throw new RangeError(
      `smoothed-minima found no turning point among ${blocks} block minima; it needs a longer record with low flows between events`,
    );
  }
  return { baseflow: joinAnchors(t, q, turningPoints), blockMinima, turningPoints };
}
