// Validation of a storm analysis's fields.
import type { AnalysisBody } from './types';
import { requireJson, requireNumber, requireObject, requireRef, requireText, requireTime } from './checks';
import { RecordValidationError } from './validation-error';

/** Checks an analysis's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateAnalysisBody(x: unknown): asserts x is AnalysisBody {
  const k = 'analysis';
  const o = requireObject(k, 'analysis', x);
  requireRef(k, 'siteId', o.siteId);
  const from = requireTime(k, 'from_ms', o.from_ms);
  const to = requireTime(k, 'to_ms', o.to_ms);
  if (!(to > from)) throw new RecordValidationError(k, 'to_ms', `after from_ms (${from})`, to);
  const method = requireObject(k, 'method', o.method);
  requireText(k, 'method.kind', method.kind, true, 60);
  requireJson(k, 'method', method);
  const p = requireObject(k, 'points', o.points);
  for (const name of ['riseStart_ms', 'peak_ms', 'inflection_ms', 'runoffEnd_ms'] as const) requireTime(k, `points.${name}`, p[name]);
  if (o.area_km2 !== undefined) requireNumber(k, 'area_km2', o.area_km2, 'km²', Number.MIN_VALUE);
  if (o.rainfall_mm !== undefined) requireNumber(k, 'rainfall_mm', o.rainfall_mm, 'mm', 0);
  const r = requireObject(k, 'results', o.results);
  requireNumber(k, 'results.peak_m3s', r.peak_m3s, 'm³/s', 0);
  requireTime(k, 'results.peakTime_ms', r.peakTime_ms);
  requireNumber(k, 'results.totalVolume_m3', r.totalVolume_m3, 'm³', 0);
  requireNumber(k, 'results.baseflowVolume_m3', r.baseflowVolume_m3, 'm³', 0);
  requireNumber(k, 'results.directVolume_m3', r.directVolume_m3, 'm³', 0);
  requireNumber(k, 'results.baseflowIndex', r.baseflowIndex, '', 0, 1);
  if (r.runoffDepth_mm !== undefined) requireNumber(k, 'results.runoffDepth_mm', r.runoffDepth_mm, 'mm', 0);
  if (r.runoffCoefficient !== undefined) requireNumber(k, 'results.runoffCoefficient', r.runoffCoefficient, '', 0);
  requireText(k, 'note', o.note);
}
