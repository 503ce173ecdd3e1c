// Reading the vertical being typed, and the kept verticals as the core's verticals with running totals.
// Pure (no DOM, no storage).
import { fromDisplay, midSection, verticalMeanVelocity, type MidSectionResult, type PointVelocities, type RecordedVertical, type UnitSystem } from '../../../core';
import type { FieldError } from '../../components/Field/field-error';
import { parseDecimal } from '../../format';
import type { EnteredVertical, GaugingForm } from './form';

/**
 * Reads the vertical entry: station, depth ≥ 0, the velocities its method needs, angle coefficient in
 * (0, 1]; the station must continue the order of those kept (ascending or descending, never repeated).
 */
export function parseVertical(form: GaugingForm, units: UnitSystem): { ok: true; vertical: EnteredVertical } | { ok: false; errors: FieldError[] } {
  const e = form.entry;
  const errors: FieldError[] = [];
  const lu = units === 'us' ? 'ft' : 'm';
  const vu = units === 'us' ? 'ft/s' : 'm/s';
  const read = (field: string, text: string, what: string, example: string): number | undefined => {
    const v = parseDecimal(text);
    if (v === undefined) errors.push({ field, text: `Type the ${what} as a number, like ${example}${text.trim() ? `; got “${text.trim()}”` : ''}.` });
    return v;
  };
  const station = read('vStation', e.stationText, `station (distance from the initial point, ${lu})`, '4.5');
  const depth = read('vDepth', e.depthText, `depth (${lu})`, '0.42');
  if (depth !== undefined && depth < 0) errors.push({ field: 'vDepth', text: `The depth must be 0 or more; got ${depth}.` });
  const vel = (field: string, text: string, at: string) => read(field, text, `velocity at ${at} depth (${vu})`, '0.35');
  const si = (v: number) => fromDisplay('velocity', v, units);
  let velocity: PointVelocities | undefined;
  if (e.kind === 'six-tenths') {
    const v06 = vel('v06', e.v06Text, '0.6');
    if (v06 !== undefined) velocity = { kind: 'six-tenths', v06_mps: si(v06) };
  } else if (e.kind === 'two-point') {
    const v02 = vel('v02', e.v02Text, '0.2');
    const v08 = vel('v08', e.v08Text, '0.8');
    if (v02 !== undefined && v08 !== undefined) velocity = { kind: 'two-point', v02_mps: si(v02), v08_mps: si(v08) };
  } else {
    const v02 = vel('v02', e.v02Text, '0.2');
    const v06 = vel('v06', e.v06Text, '0.6');
    const v08 = vel('v08', e.v08Text, '0.8');
    if (v02 !== undefined && v06 !== undefined && v08 !== undefined) velocity = { kind: 'three-point', v02_mps: si(v02), v06_mps: si(v06), v08_mps: si(v08) };
  }
  const angle = read('vAngle', e.angleText, 'angle coefficient (1 when the flow is square to the section)', '0.97');
  if (angle !== undefined && !(angle > 0 && angle <= 1)) errors.push({ field: 'vAngle', text: `The angle coefficient must be above 0 and at most 1; got ${angle}.` });
  if (station !== undefined) {
    const s = fromDisplay('length', station, units);
    const others = form.verticals.map((v) => v.station_m);
    if (form.editing !== undefined) others.splice(form.editing, 1, s);
    else others.push(s);
    const dir = Math.sign(others[1] - others[0]);
    for (let i = 1; i < others.length; i++) {
      if (Math.sign(others[i] - others[i - 1]) !== dir || dir === 0) {
        errors.push({ field: 'vStation', text: `Station ${station} ${lu} breaks the order across the section; stations must keep rising (or keep falling) and never repeat.` });
        break;
      }
    }
  }
  if (errors.length || station === undefined || depth === undefined || velocity === undefined || angle === undefined) return { ok: false, errors };
  return { ok: true, vertical: { station_m: fromDisplay('length', station, units), depth_m: fromDisplay('length', depth, units), velocity, angleCoefficient: angle } };
}

/** The kept verticals as recorded verticals: mean velocity from the point observations, which are kept too. */
export function coreVerticals(verticals: readonly EnteredVertical[]): RecordedVertical[] {
  return verticals.map((v) => ({ station_m: v.station_m, depth_m: v.depth_m, velocity_mps: verticalMeanVelocity(v.velocity), angleCoefficient: v.angleCoefficient, observed: v.velocity }));
}

/** Running totals of the kept verticals (core midSection), or undefined until they have wetted area. */
export function runningTotals(verticals: readonly EnteredVertical[]): MidSectionResult | undefined {
  if (verticals.length < 2) return undefined;
  try {
    return midSection(coreVerticals(verticals));
  } catch {
    // Only the edges so far (no wetted area): nothing to total yet.
    return undefined;
  }
}
