// The gauging form's state: a summary (time, stage, discharge, method, grade) or vertical by vertical for
// the mid-section method, and its typed actions. Pure (no DOM, no storage). Reading the form is in
// read-vertical.ts and read-gauging.ts; drafts in form-draft.ts.
import {
  toDisplay, toLocalInput, type GaugingMethod, type GaugingRecord, type MeasurementGrade, type PointVelocities, type UnitSystem,
} from '../../../core';

/** Velocity observation methods in a vertical. */
export type VelocityKind = PointVelocities['kind'];

/** The velocity methods in the order the form offers them, with their short labels. */
export const VELOCITY_KINDS: readonly [VelocityKind, string][] = [['six-tenths', '0.6 depth'], ['two-point', '0.2 + 0.8'], ['three-point', '0.2, 0.6, 0.8']];

/** The boxes Enter moves through, in order, for a velocity method. */
export function enterOrder(kind: VelocityKind): string[] {
  const velocities = kind === 'six-tenths' ? ['v06'] : kind === 'two-point' ? ['v02', 'v08'] : ['v02', 'v06', 'v08'];
  return ['vStation', 'vDepth', ...velocities];
}

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
  /** The saved gauging this form corrects: its id, the revision it started from and its time (UTC ms). */
  saved?: { id: string; rev: string; time_ms: number };
}

/** The text fields of the form set by 'set'. */
export type GaugingTextField = 'timeText' | 'stageText' | 'startStageText' | 'endStageText' | 'dischargeText' | 'observer' | 'note';

/** Changes to the form. */
export type GaugingAction =
  | { type: 'set'; field: GaugingTextField; value: string }
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

/** A number as typed back into a field: at most 6 significant figures, no trailing zeros. */
export const typedNumber = (x: number): string => String(Number(x.toPrecision(6)));

function entryOf(v: EnteredVertical, units: UnitSystem): VerticalText {
  const sp = (x: number) => typedNumber(toDisplay('velocity', x, units));
  const o = v.velocity;
  return {
    stationText: typedNumber(toDisplay('length', v.station_m, units)),
    depthText: typedNumber(toDisplay('length', v.depth_m, units)),
    kind: o.kind,
    v02Text: o.kind === 'six-tenths' ? '' : sp(o.v02_mps),
    v06Text: o.kind === 'two-point' ? '' : sp(o.v06_mps),
    v08Text: o.kind === 'six-tenths' ? '' : sp(o.v08_mps),
    angleText: typedNumber(v.angleCoefficient),
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
 * The station (display units) to offer for the next vertical: the last kept station plus the last spacing
 * (the same direction across the section), or undefined with fewer than two verticals or while correcting.
 */
export function offeredStation(form: GaugingForm, units: UnitSystem): string | undefined {
  const n = form.verticals.length;
  if (n < 2 || form.editing !== undefined) return undefined;
  const last = toDisplay('length', form.verticals[n - 1].station_m, units);
  const before = toDisplay('length', form.verticals[n - 2].station_m, units);
  // Rounded to the decimals the stations were typed with (0.1 m steps stay 0.1 m steps).
  return typedNumber(Number((2 * last - before).toFixed(6)));
}

/** A saved gauging as a form to correct it: its verticals with their point velocities, time in the site's zone. */
export function formOfGauging(g: GaugingRecord, timeZone: string, units: UnitSystem): GaugingForm {
  const stage = typedNumber(toDisplay('stage', g.meanStage_m, units));
  const verticals: EnteredVertical[] = (g.verticals ?? []).map((v) => ({
    station_m: v.station_m, depth_m: v.depth_m, angleCoefficient: v.angleCoefficient ?? 1,
    // Verticals saved before point velocities were kept: their mean velocity as a 0.6-depth reading.
    velocity: v.observed ?? { kind: 'six-tenths', v06_mps: v.velocity_mps },
  }));
  const last = verticals[verticals.length - 1];
  return {
    ...blankGaugingForm(g.observer),
    mode: g.verticals && g.verticals.length >= 2 ? 'verticals' : 'summary',
    timeText: toLocalInput(g.time_ms, timeZone), stageText: stage,
    dischargeText: typedNumber(toDisplay('discharge', g.discharge_m3s, units)),
    method: g.method, grade: g.grade, note: g.note, verticals,
    entry: { ...blankEntry(), kind: last?.velocity.kind ?? 'six-tenths', angleText: typedNumber(last?.angleCoefficient ?? 1) },
    saved: { id: g.id, rev: g.rev, time_ms: g.time_ms },
  };
}
