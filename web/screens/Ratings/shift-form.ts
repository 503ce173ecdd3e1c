// Adding a shift to a rating: constant, stage-variable (points), or prorated in time between two dates.
// Pure: typed text in, the rating's new list of dated shifts out (or refusals naming the field).
import { constantShift, fromDisplay, fromLocalInput, type DatedShift, type ShiftCurve, type UnitSystem } from '../../../core';
import { parseDecimal } from '../../format';
import type { FieldError } from '../../components/Field/field-error';

/** The kinds of shift the form adds. */
export type ShiftKind = 'constant' | 'stage-variable' | 'prorated';

/** The shift form as typed, in the site's units and zone. */
export interface ShiftForm {
  kind: ShiftKind;
  fromText: string;
  /** Constant and prorated (its start value). */
  shiftText: string;
  /** Stage-variable: one "stage shift" pair a line. */
  pointsText: string;
  /** Prorated: the end date and the shift reached there. */
  toText: string;
  endShiftText: string;
}

/** A blank shift form starting at fromText ("YYYY-MM-DDTHH:mm"). */
export const blankShiftForm = (fromText: string): ShiftForm => ({ kind: 'constant', fromText, shiftText: '', pointsText: '', toText: '', endShiftText: '' });

/** What parseShiftForm gives: the shifts to add, or the refusals. */
export type ParsedShift = { ok: true; added: DatedShift[] } | { ok: false; errors: FieldError[] };

/**
 * Reads the shift form. A constant or stage-variable shift holds from its date until the next dated
 * shift; a prorated one is two dated shifts, the first moving linearly in time to the second. Refuses
 * dates before the rating applies, an end not after the start, non-numbers, points out of stage order.
 */
export function parseShiftForm(form: ShiftForm, ctx: { units: UnitSystem; timeZone: string; validFrom_ms: number }): ParsedShift {
  const errors: FieldError[] = [];
  const su = ctx.units === 'us' ? 'ft' : 'm';
  const time = (field: string, text: string, what: string): number | undefined => {
    try {
      const t = fromLocalInput(text, ctx.timeZone);
      if (t < ctx.validFrom_ms) {
        errors.push({ field, text: `The ${what} must not be before the rating applies.` });
        return undefined;
      }
      return t;
    } catch {
      errors.push({ field, text: `Give the ${what} as a date and time.` });
      return undefined;
    }
  };
  const shift = (field: string, text: string, what: string): number | undefined => {
    const v = parseDecimal(text);
    if (v === undefined) {
      errors.push({ field, text: `Type the ${what} as a number in ${su} (negative for fill or weed), like -0.02 or 0.015.` });
      return undefined;
    }
    return fromDisplay('stage', v, ctx.units);
  };
  const from_ms = time('shiftFrom', form.fromText, 'start of the shift');
  let added: DatedShift[] = [];
  switch (form.kind) {
    case 'constant': {
      const s = shift('shiftValue', form.shiftText, 'shift');
      if (from_ms !== undefined && s !== undefined) added = [{ time_ms: from_ms, curve: constantShift(s), toNext: 'hold' }];
      break;
    }
    case 'stage-variable': {
      const curve = parsePoints(form.pointsText, ctx.units, errors);
      if (from_ms !== undefined && curve) added = [{ time_ms: from_ms, curve, toNext: 'hold' }];
      break;
    }
    case 'prorated': {
      const s1 = shift('shiftValue', form.shiftText, 'shift at the start');
      const to_ms = time('shiftTo', form.toText, 'end of the shift');
      const s2 = shift('shiftEnd', form.endShiftText, 'shift at the end');
      if (from_ms !== undefined && to_ms !== undefined && !(to_ms > from_ms)) errors.push({ field: 'shiftTo', text: 'The end must be after the start.' });
      else if (from_ms !== undefined && to_ms !== undefined && s1 !== undefined && s2 !== undefined) {
        added = [
          { time_ms: from_ms, curve: constantShift(s1), toNext: 'prorate' },
          { time_ms: to_ms, curve: constantShift(s2), toNext: 'hold' },
        ];
      }
      break;
    }
    default: {
      const unknown: never = form.kind;
      errors.push({ field: 'shiftKind', text: `Choose a kind of shift (got ${String(unknown)}).` });
    }
  }
  return errors.length > 0 ? { ok: false, errors } : { ok: true, added };
}

function parsePoints(text: string, units: UnitSystem, errors: FieldError[]): ShiftCurve | undefined {
  const lines = text.split(/\r?\n/).map((l) => l.trim()).filter(Boolean);
  if (lines.length === 0) {
    errors.push({ field: 'shiftPoints', text: 'Type at least one line “stage shift”, like “0.40 -0.02”.' });
    return undefined;
  }
  const points: ShiftCurve['points'] = [];
  for (let i = 0; i < lines.length; i++) {
    const parts = lines[i].split(/[\s;]+/).filter(Boolean);
    const h = parts.length === 2 ? parseDecimal(parts[0]) : undefined;
    const s = parts.length === 2 ? parseDecimal(parts[1]) : undefined;
    if (h === undefined || s === undefined) {
      errors.push({ field: 'shiftPoints', text: `Line ${i + 1} (“${lines[i]}”) needs two numbers: a stage and its shift.` });
      return undefined;
    }
    const p = { stage_m: fromDisplay('stage', h, units), shift_m: fromDisplay('stage', s, units) };
    if (points.length && !(p.stage_m > points[points.length - 1].stage_m)) {
      errors.push({ field: 'shiftPoints', text: `Line ${i + 1}: the stages must rise from line to line.` });
      return undefined;
    }
    points.push(p);
  }
  return { points };
}

/** The rating's shifts with `added` merged in time order; an added shift at the same time replaces the old one. */
export function mergeShifts(existing: readonly DatedShift[], added: readonly DatedShift[]): DatedShift[] {
  const times = new Set(added.map((s) => s.time_ms));
  return [...existing.filter((s) => !times.has(s.time_ms)), ...added].sort((a, b) => a.time_ms - b.time_ms);
}
