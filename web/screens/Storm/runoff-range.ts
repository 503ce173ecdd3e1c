// The storm screen's side of the runoff range: the core's rule (core/hydrograph/runoff-range.ts) fed with
// this storm's methods, the rating's standard error, the extrapolated share and the key points.
import { extrapolatedShare, runoffRange, type EventPoints, type RunoffRange } from '../../../core';
import { METHOD_LABELS } from '../../components/SeparationPicker';
import { analyse, type StormResult, type StormSeries } from './analysis';
import type { MethodOutcome } from './method-table';

export { DEFAULT_RATING_SE_PCT, type RunoffRange } from '../../../core';

/** Readings the rise start and the end of runoff are moved either way for the range (our rule: a point picked on a plot is good to about two readings). */
export const KEY_POINT_TOLERANCE_READINGS = 2;

/** The range of the chosen method's volume on this storm, or undefined without a result. */
export function stormRange(
  series: StormSeries,
  points: EventPoints,
  result: StormResult,
  rows: readonly MethodOutcome[],
  standardError_pct: number | undefined,
  area_km2: number | undefined,
): RunoffRange {
  const methods = rows.map((r) => ({
    name: METHOD_LABELS[r.kind],
    ...(r.volume_m3 !== undefined && { volume_m3: r.volume_m3 }),
    ...(r.leftOut !== undefined ? { leftOut: r.leftOut } : r.problem !== undefined ? { leftOut: r.problem } : {}),
  }));
  const share = extrapolatedShare(series.time_ms, series.discharge_m3s, result.baseflow_m3s, series.extrapolated, points.riseStart_ms, points.runoffEnd_ms);
  return runoffRange({
    volume_m3: result.summary.directVolume_m3,
    methods,
    ...(standardError_pct !== undefined && { standardError_pct }),
    extrapolatedShare: share,
    keyPointVolumes_m3: keyPointVolumes(series, points, result, area_km2),
  });
}

/** The chosen method's volume (m³) with the rise start and the end of runoff each moved by the tolerance. */
function keyPointVolumes(series: StormSeries, points: EventPoints, result: StormResult, area_km2: number | undefined): number[] {
  const t = series.time_ms;
  const at = (ms: number) => {
    let i = 0;
    while (i + 1 < t.length && t[i + 1] <= ms) i++;
    return i;
  };
  const a = at(points.riseStart_ms);
  const c = at(points.runoffEnd_ms);
  const p = at(points.peak_ms);
  const volumes: number[] = [];
  for (const [da, dc] of [[-1, 0], [1, 0], [0, -1], [0, 1]] as const) {
    const ia = Math.min(Math.max(0, a + da * KEY_POINT_TOLERANCE_READINGS), p);
    const ic = Math.max(Math.min(t.length - 1, c + dc * KEY_POINT_TOLERANCE_READINGS), at(points.inflection_ms));
    if (ia === a && ic === c) continue;
    const moved = { ...points, riseStart_ms: t[ia], runoffEnd_ms: t[ic] };
    const r = analyse(series, moved, result.method, area_km2, undefined);
    if (r.ok) volumes.push(r.value.summary.directVolume_m3);
  }
  return volumes;
}

/** A figure rounded to `digits` significant figures, for "about" sentences (0 stays 0). */
export function roundAbout(v: number, digits = 2): number {
  return Number.isFinite(v) ? Number(v.toPrecision(digits)) : v;
}
