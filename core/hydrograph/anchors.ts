// Baseflow drawn through chosen low-flow readings: linear between them, held level outside, capped at Q.

/** Baseflow (m³/s) through the readings at the given ascending indices, held level beyond the ends, ≤ Q. */
export function joinAnchors(t: Float64Array, q: Float64Array, anchors: readonly number[]): Float64Array {
  const n = q.length;
  const b = new Float64Array(n);
  let k = 0;
  for (let i = 0; i < n; i++) {
    while (k < anchors.length && anchors[k] < i) k++;
    let v: number;
    if (k === 0) v = q[anchors[0]];
    else if (k === anchors.length) v = q[anchors[anchors.length - 1]];
    else {
      const a = anchors[k - 1];
      const c = anchors[k];
      v = q[a] + ((q[c] - q[a]) * (t[i] - t[a])) / (t[c] - t[a]);
    }
    b[i] = v > q[i] ? q[i] : v;
  }
  return b;
}
