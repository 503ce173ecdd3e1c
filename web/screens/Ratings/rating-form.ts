// The hand-entry rating form: what was typed, and its reading into a rating body (SI) or a list of
// refusals each naming its field. Pure: no DOM, no storage.
import { displayUnit, fromDisplay, fromLocalInput, toDisplay, toLocalInput, type RatingSegment, type UnitSystem } from '../../../core';
import { parseDecimal } from '../../format';
import { coefficientFromSi, coefficientToSi } from './units';
import type { FieldError } from '../../components/Field/field-error';

/** One segment as typed, in the site's units. */
export interface SegmentText {
  fromText: string;
  coefficientText: string;
  offsetText: string;
  exponentText: string;
}

/** The rating form as typed: valid-from in the site's zone, segments, gauged range, note. */
export interface RatingForm {
  validFromText: string;
  segments: SegmentText[];
  rangeLowText: string;
  rangeHighText: string;
  note: string;
}


/** What parseRatingForm gives: the rating's fields in SI, or every problem found. */
export type ParsedRating =
  | { ok: true; validFrom_ms: number; segments: RatingSegment[]; gaugedRange_m?: [number, number]; note: string }
  | { ok: false; errors: FieldError[] };

/** Where the form is read: the site's units and zone and the phone's clock (UTC ms). */
export interface FormContext {
  units: UnitSystem;
  timeZone: string;
  now_ms: number;
}

/** An empty segment row. */
export const blankSegment = (): SegmentText => ({ fromText: '', coefficientText: '', offsetText: '', exponentText: '' });

/** A fresh form: valid from now, one empty segment. */
export function blankRatingForm(now_ms: number, timeZone: string): RatingForm {
  return { validFromText: toLocalInput(now_ms, timeZone), segments: [blankSegment()], rangeLowText: '', rangeHighText: '', note: '' };
}

const trimmed = (x: number) => String(Number(x.toPrecision(6)));

/** The form of stored segments (for "start from this rating"), values in the site's units. */
export function segmentTexts(segments: readonly RatingSegment[], units: UnitSystem): SegmentText[] {
  return segments.map((s) => ({
    fromText: trimmed(toDisplay('stage', s.fromStage_m, units)),
    coefficientText: trimmed(coefficientFromSi(s.coefficient, s.exponent, units)),
    offsetText: trimmed(toDisplay('stage', s.offset_m, units)),
    exponentText: trimmed(s.exponent),
  }));
}

/** A rating may apply from a typed time up to this far ahead of the clock, ms (1 min: the minute being typed). */
const VALID_FROM_AHEAD_MS = 60_000;

/**
 * The time a rating applies from, typed as a local date and time in the site's zone: the UTC ms, or why
 * it cannot be used ('unreadable': not a date and time, or a time the clock skips; 'future': after now).
 * The one rule of the hand entry, the fit and the table import.
 */
export function readValidFrom(text: string, timeZone: string, now_ms: number): { ok: true; validFrom_ms: number } | { ok: false; problem: 'unreadable' | 'future' } {
  let validFrom_ms: number;
  try {
    validFrom_ms = fromLocalInput(text, timeZone);
  } catch {
    return { ok: false, problem: 'unreadable' };
  }
  return validFrom_ms > now_ms + VALID_FROM_AHEAD_MS ? { ok: false, problem: 'future' } : { ok: true, validFrom_ms };
}

/**
 * Reads the form: every number must be a number; coefficient and exponent above 0; each segment's start
 * above the one before and its offset below its start (above the first); the gauged range low ≤ high;
 * valid-from not in the future. A blank start of the first segment means "from its offset".
 */
export function parseRatingForm(form: RatingForm, ctx: FormContext): ParsedRating {
  const errors: FieldError[] = [];
  const su = displayUnit('stage', ctx.units);
  const number = (field: string, text: string, what: string, example: string): number | undefined => {
    if (!text.trim()) {
      errors.push({ field, text: `Type the ${what}, like ${example}.` });
      return undefined;
    }
    const v = parseDecimal(text);
    if (v === undefined) errors.push({ field, text: `The ${what} must be a number, like ${example}; got “${text.trim()}”.` });
    return v;
  };
  const validFrom = readValidFrom(form.validFromText, ctx.timeZone, ctx.now_ms);
  const validFrom_ms = validFrom.ok ? validFrom.validFrom_ms : undefined;
  if (!validFrom.ok && validFrom.problem === 'future') {
    errors.push({ field: 'validFrom', text: 'The rating cannot apply from a time in the future; give today’s date or an earlier one.' });
  } else if (!validFrom.ok) {
    errors.push({ field: 'validFrom', text: 'Give the date and time the rating applies from.' });
  }
  if (form.segments.length === 0) errors.push({ field: 'segments', text: 'A rating needs at least one segment.' });
  const segments: RatingSegment[] = [];
  form.segments.forEach((s, i) => {
    const n = i + 1;
    const p = `seg${i}`;
    const offset = number(`${p}-offset`, s.offsetText, `offset (stage of zero flow) of segment ${n} in ${su}`, '0.12');
    const from = i === 0 && !s.fromText.trim() ? offset : number(`${p}-from`, s.fromText, `stage where segment ${n} starts, in ${su}`, '0.80');
    const c = number(`${p}-coefficient`, s.coefficientText, `coefficient of segment ${n}`, '8.5');
    const b = number(`${p}-exponent`, s.exponentText, `exponent of segment ${n}`, '1.7');
    if (c !== undefined && !(c > 0)) errors.push({ field: `${p}-coefficient`, text: `The coefficient of segment ${n} must be above 0; got ${c}.` });
    if (b !== undefined && !(b > 0)) errors.push({ field: `${p}-exponent`, text: `The exponent of segment ${n} must be above 0; got ${b}.` });
    if (from === undefined || offset === undefined || c === undefined || b === undefined || !(c > 0) || !(b > 0)) return;
    const seg: RatingSegment = {
      fromStage_m: fromDisplay('stage', from, ctx.units),
      offset_m: fromDisplay('stage', offset, ctx.units),
      coefficient: coefficientToSi(c, b, ctx.units),
      exponent: b,
    };
    if (i > 0 && !(seg.offset_m < seg.fromStage_m)) {
      errors.push({ field: `${p}-offset`, text: `The offset of segment ${n} must be below the stage where it starts (${from} ${su}); got ${offset} ${su}.` });
      return;
    }
    const before = segments[segments.length - 1];
    if (i > 0 && before && segments.length === i && !(seg.fromStage_m > before.fromStage_m)) {
      errors.push({ field: `${p}-from`, text: `Segment ${n} must start above segment ${i}, which starts at ${trimmed(toDisplay('stage', before.fromStage_m, ctx.units))} ${su}; list the segments from the lowest up.` });
      return;
    }
    segments.push(seg);
  });
  let gaugedRange_m: [number, number] | undefined;
  const lowBlank = !form.rangeLowText.trim();
  const highBlank = !form.rangeHighText.trim();
  if (lowBlank !== highBlank) {
    errors.push({ field: lowBlank ? 'rangeLow' : 'rangeHigh', text: 'Give both ends of the gauged range, or neither.' });
  } else if (!lowBlank) {
    const lo = number('rangeLow', form.rangeLowText, `lowest gauged stage in ${su}`, '0.25');
    const hi = number('rangeHigh', form.rangeHighText, `highest gauged stage in ${su}`, '1.40');
    if (lo !== undefined && hi !== undefined) {
      if (lo > hi) errors.push({ field: 'rangeHigh', text: `The highest gauged stage (${hi} ${su}) must not be below the lowest (${lo} ${su}).` });
      else gaugedRange_m = [fromDisplay('stage', lo, ctx.units), fromDisplay('stage', hi, ctx.units)];
    }
  }
  if (gaugedRange_m && segments.length > 0 && !(segments[0].offset_m < gaugedRange_m[0])) {
    errors.push({ field: 'seg0-offset', text: `The offset (stage of zero flow) must be below the lowest gauged stage (${form.rangeLowText.trim()} ${su}).` });
  }
  if (errors.length > 0 || validFrom_ms === undefined) return { ok: false, errors };
  return { ok: true, validFrom_ms, segments, ...(gaugedRange_m && { gaugedRange_m }), note: form.note.trim() };
}

/** Stages (m) at which the form shows the discharge as it is typed: five across the gauged range, or from the offset up. */
export function previewStages(segments: readonly RatingSegment[], gaugedRange_m?: [number, number]): number[] {
  const first = segments[0];
  const last = segments[segments.length - 1];
  const lo = gaugedRange_m ? gaugedRange_m[0] : first.offset_m;
  const top = Math.max(last.fromStage_m, first.offset_m) + (last.fromStage_m > first.offset_m ? 0.5 * (last.fromStage_m - first.offset_m) : 1);
  const hi = gaugedRange_m ? gaugedRange_m[1] : top;
  if (!(hi > lo)) return [lo];
  return [0, 0.25, 0.5, 0.75, 1].map((f) => lo + f * (hi - lo));
}
