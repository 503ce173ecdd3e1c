// Validation of a gauging's fields.
import type { GaugingBody } from './types';
import { verticalMeanVelocity, type PointVelocities } from '../gauging/vertical-velocity';
import { GAUGING_GRADES, GAUGING_METHODS } from './types';
import { requireNumber, requireObject, requireOneOf, requireRef, requireText, requireTime } from './checks';
import { RecordValidationError } from './validation-error';
import { MAX_ABS_STAGE_M } from './validate-reading';

/** Velocities the kind of observation needs (m/s). */
const POINTS_OF: Record<PointVelocities['kind'], readonly ('v02_mps' | 'v06_mps' | 'v08_mps')[]> = {
  'six-tenths': ['v06_mps'], 'two-point': ['v02_mps', 'v08_mps'], 'three-point': ['v02_mps', 'v06_mps', 'v08_mps'],
};

/** Checks a vertical's point velocities: a known kind, its velocities, and a mean equal to velocity_mps. */
function validateObserved(field: string, x: unknown, velocity_mps: number): void {
  const k = 'gauging';
  const o = requireObject(k, field, x);
  const kind = requireOneOf(k, `${field}.kind`, o.kind, Object.keys(POINTS_OF) as PointVelocities['kind'][]);
  for (const v of POINTS_OF[kind]) requireNumber(k, `${field}.${v}`, o[v], 'm/s');
  const mean = verticalMeanVelocity(o as unknown as PointVelocities);
  // The stored mean must be the one the points give (to rounding), or the record says two things.
  if (Math.abs(mean - velocity_mps) > 1e-9 * Math.max(1, Math.abs(mean))) {
    throw new RecordValidationError(k, field, `point velocities whose mean is the vertical's velocity (${velocity_mps} m/s)`, x);
  }
}

/** Checks a gauging's fields (not its envelope); throws a RecordValidationError naming the first bad field. */
export function validateGaugingBody(x: unknown): asserts x is GaugingBody {
  const k = 'gauging';
  const o = requireObject(k, 'gauging', x);
  requireRef(k, 'siteId', o.siteId);
  requireTime(k, 'time_ms', o.time_ms);
  requireNumber(k, 'meanStage_m', o.meanStage_m, 'm', -MAX_ABS_STAGE_M, MAX_ABS_STAGE_M);
  requireNumber(k, 'discharge_m3s', o.discharge_m3s, 'm³/s', 0);
  requireOneOf(k, 'method', o.method, GAUGING_METHODS);
  requireOneOf(k, 'grade', o.grade, GAUGING_GRADES);
  requireText(k, 'observer', o.observer, false, 200);
  requireText(k, 'note', o.note);
  if (o.verticals === undefined) return;
  if (!Array.isArray(o.verticals)) throw new RecordValidationError(k, 'verticals', 'a list of verticals', o.verticals);
  o.verticals.forEach((v: unknown, i: number) => {
    const f = `verticals[${i}]`;
    const p = requireObject(k, f, v);
    requireNumber(k, `${f}.station_m`, p.station_m, 'm');
    requireNumber(k, `${f}.depth_m`, p.depth_m, 'm', 0);
    requireNumber(k, `${f}.velocity_mps`, p.velocity_mps, 'm/s');
    if (p.angleCoefficient !== undefined) requireNumber(k, `${f}.angleCoefficient`, p.angleCoefficient, '', 0, 1);
    if (p.observed !== undefined) validateObserved(`${f}.observed`, p.observed, p.velocity_mps as number);
  });
}
