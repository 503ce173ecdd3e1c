// The gauging form as a kept draft: to JSON fields and back, checking every field read back. Pure.
import { GAUGING_GRADES, GAUGING_METHODS, type GaugingMethod, type JsonValue, type MeasurementGrade, type PointVelocities } from '../../../core';
import { blankEntry, blankGaugingForm, type EnteredVertical, type GaugingForm, type VelocityKind } from './form';

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

function restoreSaved(x: unknown): GaugingForm['saved'] {
  if (!x || typeof x !== 'object') return undefined;
  const s = x as Record<string, unknown>;
  return isText(s.id) && isText(s.rev) && finite(s.time_ms) ? { id: s.id, rev: s.rev, time_ms: s.time_ms } : undefined;
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
  const saved = restoreSaved(f.saved);
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
    ...(saved && { saved }),
  };
  return { form, dropped: list.length - verticals.length };
}

/** Whether the form holds anything worth keeping as a draft. */
export function hasContent(form: GaugingForm): boolean {
  return form.verticals.length > 0 || [form.stageText, form.startStageText, form.endStageText, form.dischargeText, form.note, form.entry.stationText, form.entry.depthText].some((t) => t.trim() !== '');
}
