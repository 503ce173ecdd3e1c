// Unit hydrograph from an isolated storm: direct-runoff ordinates scaled to a given runoff depth.
import { trapezoidVolumes } from './integrate';
import { checkArea, prepareSeries, type Series } from './series';
import { checkBaseflow } from './summary';

/** Options of unitHydrograph: catchment area (km²) and the unit depth (mm, default 10). */
export interface UnitHydrographOptions {
  area_km2: number;
  depth_mm?: number;
}

/** Default unit depth of a unit hydrograph, mm. */
export const defaultUnitDepth_mm = 10;

/**
 * Unit hydrograph (m³/s per depth_mm of direct runoff) at the same times: (Q − b)·depth_mm / R, where R (mm)
 * is the event's direct-runoff depth over the area. The rainfall-excess duration is the caller's to state.
 */
export function unitHydrograph(series: Series, baseflow: ArrayLike<number>, options: UnitHydrographOptions): Series {
  const fn = 'unitHydrograph';
  const { time_ms: t, discharge_m3s: q } = prepareSeries(series, fn);
  checkBaseflow(baseflow, q, fn);
  const area = checkArea(options?.area_km2, fn);
  const depth = options.depth_mm ?? defaultUnitDepth_mm;
  if (typeof depth !== 'number' || !Number.isFinite(depth) || !(depth > 0)) {
    throw new RangeError(`${fn} needs depth_mm above 0; got ${String(depth)}`);
  }
  const { total_m3, baseflow_m3 } = trapezoidVolumes(t, q, baseflow, t[0], t[t.length - 1]);
  const runoff_mm = (total_m3 - baseflow_m3) / (area * 1e3);
  if (!(runoff_mm > 0)) {
    throw new RangeError(`${fn} needs some direct runoff (discharge above baseflow); the direct-runoff depth is ${runoff_mm} mm`);
  }
  const scale = depth / runoff_mm;
  const ordinates = new Float64Array(q.length);
  for (let i = 0; i < q.length; i++) ordinates[i] = Math.max(0, q[i] - baseflow[i]) * scale;
  return { time_ms: series.time_ms, discharge_m3s: ordinates };
}
