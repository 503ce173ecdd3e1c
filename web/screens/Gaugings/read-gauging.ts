// Reading the whole gauging form into a gauging body. Pure (no DOM, no storage).
import { fromDisplay, fromLocalInput, GAUGING_GRADES, GAUGING_METHODS, toLocalInput, type GaugingBody, type UnitSystem } from '../../../core';
import type { FieldError } from '../../components/Field/field-error';
import { parseDecimal } from '../../format';
import type { GaugingForm } from './form';
import { coreVerticals, runningTotals } from './read-vertical';

/** Where and what to save: time (UTC ms) and the clock, the site's units and zone. */
export interface GaugingContext {
  units: UnitSystem;
  timeZone: string;
  now_ms: number;
  siteId: string;
}

/** The gauging's time (UTC ms): the saved time while its minute is unchanged, else the typed one, else now. */
function timeOf(form: GaugingForm, ctx: GaugingContext, errors: FieldError[]): number {
  const now = Math.floor(ctx.now_ms / 1000) * 1000;
  if (!form.timeText) return form.saved?.time_ms ?? now;
  // The field shows whole minutes: a correction that leaves the minute alone keeps the saved seconds.
  if (form.saved && toLocalInput(form.saved.time_ms, ctx.timeZone) === form.timeText) return form.saved.time_ms;
  try {
    const t = fromLocalInput(form.timeText, ctx.timeZone);
    if (t > ctx.now_ms + 5 * 60_000) errors.push({ field: 'gTime', text: 'The time is in the future; give the time the measurement was made.' });
    return t;
  } catch {
    errors.push({ field: 'gTime', text: 'Give the date and time of the measurement.' });
    return now;
  }
}

/**
 * Reads the whole form into a gauging body: time not in the future, a stage (mean, or start and end
 * averaged), and the discharge typed (summary) or the mid-section total of at least 2 verticals.
 */
export function parseGaugingForm(form: GaugingForm, ctx: GaugingContext): { ok: true; body: GaugingBody } | { ok: false; errors: FieldError[] } {
  const errors: FieldError[] = [];
  const su = ctx.units === 'us' ? 'ft' : 'm';
  const time_ms = timeOf(form, ctx, errors);
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
