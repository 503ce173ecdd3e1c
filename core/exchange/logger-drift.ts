// Drift correction of a logger record from check readings (common practice; the USGS calls these
// gage-height corrections between inspections): at each check the correction is the staff value minus
// the logger value; between two checks it is prorated linearly in time; before the first check it holds
// the first correction and after the last the last. The raw values are never changed: corrected = raw + c(t).

/** A check: a staff (or other gauge) reading beside the logger at one time, UTC ms; stages in m. */
export interface DriftCheck {
  time_ms: number;
  /** The staff gauge reading, m above gauge datum. */
  staff_m: number;
  /** The logger's value at the same time, m above gauge datum. */
  logger_m: number;
  /** The stored check reading it came from, when there is one. */
  readingId?: string;
}

/** A check with its correction (staff − logger, m), as the correction table shows it. */
export interface DriftTableRow extends DriftCheck {
  correction_m: number;
}

/** The checks sorted by time with their corrections (staff − logger, m); a RangeError for bad or same-time checks. */
export function driftTable(checks: readonly DriftCheck[]): DriftTableRow[] {
  const rows = checks.map((c, i) => {
    for (const [name, v] of [['time_ms', c.time_ms], ['staff_m', c.staff_m], ['logger_m', c.logger_m]] as const) {
      if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`Check ${i + 1} needs a finite ${name}; got ${String(v)}`);
    }
    return { ...c, correction_m: c.staff_m - c.logger_m };
  });
  rows.sort((a, b) => a.time_ms - b.time_ms);
  for (let i = 1; i < rows.length; i++) {
    if (rows[i].time_ms === rows[i - 1].time_ms) {
      throw new RangeError('Two checks have the same time; keep one check per time (or average them first)');
    }
  }
  return rows;
}

/**
 * The drift correction (m) at each time of time_ms (UTC ms, any order) from the checks: linear in time
 * between neighbouring checks, held before the first and after the last, 0 everywhere without checks.
 */
export function driftCorrections(checks: readonly DriftCheck[], time_ms: ArrayLike<number>): Float64Array {
  const table = driftTable(checks);
  const out = new Float64Array(time_ms.length);
  if (table.length === 0) return out;
  const first = table[0];
  const last = table[table.length - 1];
  let k = 0;
  for (let i = 0; i < time_ms.length; i++) {
    const t = time_ms[i];
    if (t <= first.time_ms) {
      out[i] = first.correction_m;
      continue;
    }
    if (t >= last.time_ms) {
      out[i] = last.correction_m;
      continue;
    }
    // Sorted input walks k forward; otherwise step back to the bracketing pair.
    while (k > 0 && table[k].time_ms > t) k--;
    while (table[k + 1].time_ms < t) k++;
    const a = table[k];
    const b = table[k + 1];
    const w = (t - a.time_ms) / (b.time_ms - a.time_ms);
    out[i] = a.correction_m + w * (b.correction_m - a.correction_m);
  }
  return out;
}

/**
 * The logger's value at time t (UTC ms) read from its own record: linear between the two records either
 * side when both lie within maxGap_ms of t; the record itself at its exact time; undefined otherwise.
 */
export function loggerValueAt(time_ms: ArrayLike<number>, level_m: ArrayLike<number>, t: number, maxGap_ms: number): number | undefined {
  let lo = 0;
  let hi = time_ms.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (time_ms[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  if (lo < time_ms.length && time_ms[lo] === t) return level_m[lo];
  if (lo === 0 || lo === time_ms.length) return undefined;
  const t0 = time_ms[lo - 1];
  const t1 = time_ms[lo];
  if (t - t0 > maxGap_ms || t1 - t > maxGap_ms) return undefined;
  return level_m[lo - 1] + ((t - t0) / (t1 - t0)) * (level_m[lo] - level_m[lo - 1]);
}
