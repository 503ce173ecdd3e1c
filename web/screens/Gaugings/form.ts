// The gauging form: a summary (time, stage, discharge, method, grade) or vertical by vertical for the
// mid-section method. State, typed actions, reading a vertical and the whole form; pure (no DOM, no storage).
import {
  fromDisplay, fromLocalInput, GAUGING_GRADES, GAUGING_METHODS, midSection, toDisplay, verticalMeanVelocity,
  type GaugingBody, type GaugingMethod, type JsonValue, type MeasurementGrade, type MidSectionResult, type PointVelocities,
  type UnitSystem,
} from '../../../core';
import { parseDecimal } from '../../format';
import type { FieldError } from '../Ratings/rating-form';

/** Velocity observation methods in a vertical. */
export type VelocityKind = PointVelocities['kind'];

/** One vertical as typed (site units). */
export interface VerticalText {
  stationText: string;
  depthText: string;
  kind: VelocityKind;
  v02Text: string;
  v06Text: string;
  v08Text: string;
  angleText: string;
}

/** One vertical kept in the form: SI values and the point velocities it was read from. */
export interface EnteredVertical {
  station_m: number;
  depth_m: number;
  velocity: PointVelocities;
  angleCoefficient: number;
}

/** The whole form. Stage either as a mean or from start and end stages. */
export interface GaugingForm {
  mode: 'summary' | 'verticals';
  timeText: string;
  stageMode: 'mean' | 'start-end';
  stageText: string;
  startStageText: string;
  endStageText: string;
  dischargeText: string;
  method: GaugingMethod;
  grade: MeasurementGrade;
  observer: string;
  note: string;
  verticals: EnteredVertical[];
  entry: VerticalText;
  /** Index of the vertical being corrected, if any. */
  editing?: number;
}

/** Changes to the form. */
export type GaugingAction =
  | { type: 'set'; field: 'timeText' | 'stageText' | 'startStageText' | 'endStageText' | 'dischargeText' | 'observer' | 'note'; value: string }
  | { type: 'mode'; value: GaugingForm['mode'] }
  | { type: 'stageMode'; value: GaugingForm['stageMode'] }
  | { type: 'method'; value: GaugingMethod }
  | { type: 'grade'; value: MeasurementGrade }
  | { type: 'entry'; field: keyof Omit<VerticalText, 'kind'>; value: string }
  | { type: 'entryKind'; value: VelocityKind }
  | { type: 'edge' }
  | { type: 'keepVertical'; vertical: EnteredVertical }
  | { type: 'editVertical'; index: number; units: UnitSystem }
  | { type: 'removeVertical'; index: number }
  | { type: 'cancelEdit' }
  | { type: 'replace'; form: GaugingForm };

/** An empty vertical entry: 0.6 depth method, angle coefficient 1. */
export const blankEntry = (): VerticalText => ({ stationText: '', depthText: '', kind: 'six-tenths', v02Text: '', v06Text: '', v08Text: '', angleText: '1' });

/** A fresh gauging form: vertical by vertical, velocity–area, good grade; time empty (follows the clock). */
export function blankGaugingForm(observer: string): GaugingForm {
  return {
    mode: 'verticals', timeText: '', stageMode: 'mean', stageText: '', startStageText: '', endStageText: '', dischargeText: '',
    method: 'velocity-area', grade: 'good', observer, note: '', verticals: [], entry: blankEntry(),
  };
}

const num = (x: number) => String(Number(x.toPrecision(6)));

function entryOf(v: EnteredVertical, units: UnitSystem): VerticalText {
  const sp = (x: number) => num(toDisplay('velocity', x, units));
  const o = v.velocity;
  return {
    stationText: num(toDisplay('length', v.station_m, units)),
    depthText: num(toDisplay('length', v.depth_m, units)),
    kind: o.kind,
    v02Text: o.kind === 'six-tenths' ? '' : sp(o.v02_mps),
    v06Text: o.kind === 'two-point' ? '' : sp(o.v06_mps),
    v08Text: o.kind === 'six-tenths' ? '' : sp(o.v08_mps),
    angleText: num(v.angleCoefficient),
  };
}

/** The reducer behind the gauging form. Kept verticals stay in station order as typed. */
export function gaugingReducer(form: GaugingForm, a: GaugingAction): GaugingForm {
  switch (a.type) {
    case 'set':
      return { ...form, [a.field]: a.value };
    case 'mode':
      return { ...form, mode: a.value };
    case 'stageMode':
      return { ...form, stageMode: a.value };
    case 'method':
      return { ...form, method: a.value };
    case 'grade':
      return { ...form, grade: a.value };
    case 'entry':
      return { ...form, entry: { ...form.entry, [a.field]: a.value } };
    case 'entryKind':
      return { ...form, entry: { ...form.entry, kind: a.value } };
    case 'edge':
      return { ...form, entry: { ...form.entry, depthText: '0', kind: 'six-tenths', v06Text: '0', v02Text: '', v08Text: '' } };
    case 'keepVertical': {
      const verticals = [...form.verticals];
      if (form.editing !== undefined) verticals[form.editing] = a.vertical;
      else verticals.push(a.vertical);
      // The next vertical starts from the same method and angle: only station, depth and velocities change.
      return { ...form, verticals, editing: undefined, entry: { ...blankEntry(), kind: form.entry.kind, angleText: form.entry.angleText } };
    }
    case 'editVertical':
      return { ...form, editing: a.index, entry: entryOf(form.verticals[a.index], a.units) };
    case 'removeVertical': {
      const verticals = form.verticals.filter((_, i) => i !== a.index);
      return { ...form, verticals, editing: undefined, entry: form.editing === a.index ? blankEntry() : form.entry };
    }
    case 'cancelEdit':
      return { ...form, editing: undefined, entry: blankEntry() };
    case 'replace':
      return a.form;
  }
}

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
  let velocity: PointVelocities | undefined;
  if (e.kind === 'six-tenths') {
    const v06 = vel('v06', e.v06Text, '0.6');
    if (v06 !== undefined) velocity = { kind: 'six-tenths', v06_mps: fromDisplay('velocity', v06, units) };
  } else if (e.kind === 'two-point') {
    const v02 = vel('v02', e.v02Text, '0.2');
    const v08 = vel('v08', e.v08Text, '0.8');
    if (v02 !== undefined && v08 !== undefined) velocity = { kind: 'two-point', v02_mps: fromDisplay('velocity', v02, units), v08_mps: fromDisplay('velocity', v08, units) };
  } else {
    const v02 = vel('v02', e.v02Text, '0.2');
    const v06 = vel('v06', e.v06Text, '0.6');
    const v08 = vel('v08', e.v08Text, '0.8');
    if (v02 !== undefined && v06 !== undefined && v08 !== undefined) {
      velocity = { kind: 'three-point', v02_mps: fromDisplay('velocity', v02, units), v06_mps: fromDisplay('velocity', v06, units), v08_mps: fromDisplay('velocity', v08, units) };
    }
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

/** The kept verticals as the core's verticals (mean velocity from the point observations). */
export function coreVerticals(verticals: readonly EnteredVertical[]) {
  return verticals.map((v) => ({ station_m: v.station_m, depth_m: v.depth_m, velocity_mps: verticalMeanVelocity(v.velocity), angleCoefficient: v.angleCoefficient }));
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

/** Where and what to save: time (UTC ms) and the clock, the site's units and zone. */
export interface GaugingContext {
  units: UnitSystem;
  timeZone: string;
  now_ms: number;
  siteId: string;
}

/**
 * Reads the whole form into a gauging body: time not in the future, a stage (mean, or start and end
 * averaged), and the discharge typed (summary) or the mid-section total of at least 2 verticals.
 */
export function parseGaugingForm(form: GaugingForm, ctx: GaugingContext): { ok: true; body: GaugingBody } | { ok: false; errors: FieldError[] } {
  const errors: FieldError[] = [];
  const su = ctx.units === 'us' ? 'ft' : 'm';
  let time_ms = Math.floor(ctx.now_ms / 1000) * 1000;
  if (form.timeText) {
    try {
      time_ms = fromLocalInput(form.timeText, ctx.timeZone);
      if (time_ms > ctx.now_ms + 5 * 60_000) errors.push({ field: 'gTime', text: 'The time is in the future; give the time the measurement was made.' });
    } catch {
      errors.push({ field: 'gTime', text: 'Give the date and time of the measurement.' });
    }
  }
  const stageOf = (field: string, text: string, what: string): number | undefined => {
    const v = parseDecimal(text);
    if (v === undefined) errors.push({ field, text: `Type the ${what} in ${su} as a number, like 0.734${text.trim() ? `; got “${text.trim()}”` : ''}.` });
    return v === undefined ? undefined : fromDisplay('stage', v, ctx.units);
  };
  let meanStage_m: number | undefined;
  if (form.stageMode === 'mean') meanStage_m = stageOf('gStage', form.stageText, 'mean stage');
  else {
    const a = stageOf('gStartStage', form.startStageText, 'stage at the start');
    const b = stageOf('gEndStage', form.endStageText, 'stage at the end');
    if (a !== undefined && b !== undefined) meanStage_m = (a + b) / 2;
  }
  let discharge_m3s: number | undefined;
  let verticals: GaugingBody['verticals'];
  if (form.mode === 'summary') {
    const v = parseDecimal(form.dischargeText);
    if (v === undefined) errors.push({ field: 'gDischarge', text: `Type the measured discharge in ${ctx.units === 'us' ? 'ft³/s' : 'm³/s'} as a number, like 2.45.` });
    else if (v < 0) errors.push({ field: 'gDischarge', text: `The measured discharge must be 0 or more; got ${v}.` });
    else discharge_m3s = fromDisplay('discharge', v, ctx.units);
  } else {
    const totals = runningTotals(form.verticals);
    if (!totals) errors.push({ field: 'verticals', text: 'Keep at least two verticals with some depth between them (the edges of water and the verticals across).' });
    else if (!(totals.discharge_m3s >= 0)) errors.push({ field: 'verticals', text: 'The verticals give a total discharge below 0; check the velocities.' });
    else {
      discharge_m3s = totals.discharge_m3s;
      verticals = coreVerticals(form.verticals);
    }
  }
  if (!(GAUGING_METHODS as readonly string[]).includes(form.method)) errors.push({ field: 'gMethod', text: 'Choose how the discharge was measured.' });
  if (!(GAUGING_GRADES as readonly string[]).includes(form.grade)) errors.push({ field: 'gGrade', text: 'Choose the grade of the measurement.' });
  if (errors.length || meanStage_m === undefined || discharge_m3s === undefined) return { ok: false, errors };
  return {
    ok: true,
    body: {
      siteId: ctx.siteId, time_ms, meanStage_m, discharge_m3s, method: form.mode === 'verticals' ? 'velocity-area' : form.method, grade: form.grade,
      observer: form.observer.trim(), note: form.note.trim(), ...(verticals && { verticals }),
    },
  };
}

/** The form as draft fields (JSON). */
export function toDraftFields(form: GaugingForm): { [key: string]: JsonValue } {
  return JSON.parse(JSON.stringify(form)) as { [key: string]: JsonValue };
}

const isText = (x: unknown): x is string => typeof x === 'string';
const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

function restoreVertical(x: unknown): EnteredVertical | undefined {
  if (!x || typeof x !== 'object') return undefined;
  const v = x as Record<string, unknown>;
  const o = v.velocity as Record<string, unknown> | undefined;
  if (!finite(v.station_m) || !finite(v.depth_m) || !(v.depth_m >= 0) || !finite(v.angleCoefficient) || !o) return undefined;
  let velocity: PointVelocities | undefined;
  if (o.kind === 'six-tenths' && finite(o.v06_mps)) velocity = { kind: 'six-tenths', v06_mps: o.v06_mps };
  else if (o.kind === 'two-point' && finite(o.v02_mps) && finite(o.v08_mps)) velocity = { kind: 'two-point', v02_mps: o.v02_mps, v08_mps: o.v08_mps };
  else if (o.kind === 'three-point' && finite(o.v02_mps) && finite(o.v06_mps) && finite(o.v08_mps)) {
    velocity = { kind: 'three-point', v02_mps: o.v02_mps, v06_mps: o.v06_mps, v08_mps: o.v08_mps };
  }
  return velocity && { station_m: v.station_m, depth_m: v.depth_m, velocity, angleCoefficient: v.angleCoefficient };
}

/** A form restored from draft fields; anything malformed falls back to the blank form's value (a bad vertical is dropped and counted). */
export function fromDraftFields(fields: { [key: string]: JsonValue }, observer: string): { form: GaugingForm; dropped: number } {
  const base = blankGaugingForm(observer);
  const f = fields as Record<string, unknown>;
  const text = (k: keyof GaugingForm) => (isText(f[k]) ? (f[k] as string) : (base[k] as string));
  const list = Array.isArray(f.verticals) ? f.verticals : [];
  const verticals = list.map(restoreVertical).filter((v): v is EnteredVertical => !!v);
  const e = (f.entry ?? {}) as Record<string, unknown>;
  const be = blankEntry();
  const kinds: VelocityKind[] = ['six-tenths', 'two-point', 'three-point'];
  const form: GaugingForm = {
    mode: f.mode === 'summary' ? 'summary' : 'verticals',
    timeText: text('timeText'),
    stageMode: f.stageMode === 'start-end' ? 'start-end' : 'mean',
    stageText: text('stageText'), startStageText: text('startStageText'), endStageText: text('endStageText'), dischargeText: text('dischargeText'),
    method: (GAUGING_METHODS as readonly unknown[]).includes(f.method) ? (f.method as GaugingMethod) : base.method,
    grade: (GAUGING_GRADES as readonly unknown[]).includes(f.grade) ? (f.grade as MeasurementGrade) : base.grade,
    observer: text('observer'), note: text('note'), verticals,
    entry: {
      stationText: isText(e.stationText) ? e.stationText : '', depthText: isText(e.depthText) ? e.depthText : '',
      kind: kinds.includes(e.kind as VelocityKind) ? (e.kind as VelocityKind) : be.kind,
      v02Text: isText(e.v02Text) ? e.v02Text : '', v06Text: isText(e.v06Text) ? e.v06Text : '', v08Text: isText(e.v08Text) ? e.v08Text : '',
      angleText: isText(e.angleText) ? e.angleText : '1',
    },
  };
  return { form, dropped: list.length - verticals.length };
}

/** Whether the form holds anything worth keeping as a draft. */
export function hasContent(form: GaugingForm): boolean {
  return form.verticals.length > 0 || [form.stageText, form.startStageText, form.endStageText, form.dischargeText, form.note, form.entry.stationText, form.entry.depthText].some((t) => t.trim() !== '');
}
