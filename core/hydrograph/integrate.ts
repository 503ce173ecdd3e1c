// Trapezoid-rule volumes over a time window, on the union of reading times and the window ends.
import { indexAtOrBefore, interpolateAt, type BaseflowNodes } from './series';

/** Volumes (m³) of Q and of b between from_ms and to_ms: trapezoids in seconds × m³/s. */
export function trapezoidVolumes(
  t: Float64Array,
  q: Float64Array,
  b: ArrayLike<number>,
  from_ms: number,
  to_ms: number,
): { total_m3: number; baseflow_m3: number } {
  let total = 0;
  let base = 0;
  if (!(to_ms > from_ms)) return { total_m3: 0, baseflow_m3: 0 };
  let i = Math.max(0, indexAtOrBefore(t, from_ms));
  let x0 = from_ms;
  let q0 = at(t, q, i, from_ms);
  let b0 = at(t, b, i, from_ms);
  const n = t.length;
  while (x0 < to_ms) {
    const next = i + 1 < n && t[i + 1] < to_ms ? t[i + 1] : to_ms;
    const q1 = next === t[i + 1] ? q[i + 1] : at(t, q, i, next);
    const b1 = next === t[i + 1] ? b[i + 1] : at(t, b, i, next);
    const dt = (next - x0) / 1000;
    total += 0.5 * (q0 + q1) * dt;
    base += 0.5 * (b0 + b1) * dt;
    x0 = next;
    q0 = q1;
    b0 = b1;
    i++;
  }
  return { total_m3: total, baseflow_m3: base };
}

function at(t: Float64Array, y: ArrayLike<number>, i: number, x: number): number {
  if (i >= t.length - 1) return y[t.length - 1];
  return y[i] + ((y[i + 1] - y[i]) * (x - t[i])) / (t[i + 1] - t[i]);
}

/**
 * The same with extra nodes where the baseflow line bends between readings (key points): volumes (m³) on the
 * union of reading times, node times and the window ends, b linear between neighbouring readings and nodes.
 */
export function trapezoidVolumesWithNodes(
  t: Float64Array,
  q: Float64Array,
  b: ArrayLike<number>,
  from_ms: number,
  to_ms: number,
  nodes: BaseflowNodes,
): { total_m3: number; baseflow_m3: number } {
  if (!(to_ms > from_ms)) return { total_m3: 0, baseflow_m3: 0 };
  const xs: number[] = [];
  const bs: number[] = [];
  let k = 0;
  const order = nodes.time_ms.map((x, j) => j).sort((i, j) => nodes.time_ms[i] - nodes.time_ms[j]);
  for (let i = 0; i <= t.length; i++) {
    const ti = i < t.length ? t[i] : Infinity;
    while (k < order.length && nodes.time_ms[order[k]] <= ti) {
      const x = nodes.time_ms[order[k]];
      if (xs.length > 0 && xs[xs.length - 1] === x) bs[bs.length - 1] = nodes.baseflow_m3s[order[k]];
      else {
        xs.push(x);
        bs.push(nodes.baseflow_m3s[order[k]]);
      }
      k++;
    }
    if (i < t.length && !(xs.length > 0 && xs[xs.length - 1] === ti)) {
      xs.push(ti);
      bs.push(b[i]);
    }
  }
  let total = 0;
  let base = 0;
  let x0 = from_ms;
  let q0 = interpolateAt(t, q, from_ms);
  let b0 = interpolateAt(xs, bs, from_ms);
  for (let j = 0; j <= xs.length; j++) {
    const x1 = j < xs.length ? Math.min(xs[j], to_ms) : to_ms;
    if (x1 <= x0) continue;
    const q1 = interpolateAt(t, q, x1);
    const b1 = j < xs.length && xs[j] <= to_ms ? bs[j] : interpolateAt(xs, bs, x1);
    const dt = (x1 - x0) / 1000;
    total += 0.5 * (q0 + q1) * dt;
    base += 0.5 * (b0 + b1) * dt;
    x0 = x1;
    q0 = q1;
    b0 = b1;
    if (x0 >= to_ms) break;
  }
  return { total_m3: total, baseflow_m3: base };
}
