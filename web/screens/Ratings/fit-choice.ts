// Fitting a rating on the phone: which gaugings by default, the choices typed (segments, breakpoint,
// offset fitted or fixed, joined), and the core fit they lead to, or a refusal naming the field.
import { fitSegments, fromDisplay, type GaugingRecord, type SegmentsFit, type UnitSystem } from '../../../core';
import { parseDecimal } from '../../format';
import { plainError } from '../../plain-words';
import type { FieldError } from '../../components/Field/field-error';

/** How many of the latest gaugings are ticked when the fit screen opens. */
export const DEFAULT_FIT_COUNT = 20;

/** The choices of the fit form, as typed. */
export interface FitChoices {
  segmentCount: 1 | 2;
  breakpointText: string;
  offsetMode: 'fit' | 'fixed';
  offsetText: string;
  join: boolean;
}

/** Default choices: one segment, offset found by the fit (seeded with Johnson's estimate). */
export const DEFAULT_FIT_CHOICES: FitChoices = { segmentCount: 1, breakpointText: '', offsetMode: 'fit', offsetText: '', join: true };

/** Ids of the gaugings ticked by default: the latest `count` with a discharge above 0. */
export function defaultSelection(gaugings: readonly GaugingRecord[], count = DEFAULT_FIT_COUNT): Set<string> {
  const usable = gaugings.filter((g) => g.discharge_m3s > 0).sort((a, b) => b.time_ms - a.time_ms);
  return new Set(usable.slice(0, count).map((g) => g.id));
}

/** The outcome of a fit: the core's fit with the gaugings used (oldest first), or the refusals. */
export type FitOutcome = { ok: true; fit: SegmentsFit; used: GaugingRecord[] } | { ok: false; errors: FieldError[] };

/**
 * Fits the ticked gaugings with the choices. Refuses (naming the field): a breakpoint or fixed offset
 * that is not a number, a fixed offset at or above the lowest ticked gauging, a breakpoint outside the
 * ticked stages, too few gaugings, or whatever the core refuses (its sentence, on the gaugings list).
 */
export function runFit(gaugings: readonly GaugingRecord[], selected: ReadonlySet<string>, choices: FitChoices, units: UnitSystem): FitOutcome {
  const used = gaugings.filter((g) => selected.has(g.id) && g.discharge_m3s > 0).sort((a, b) => a.time_ms - b.time_ms);
  const errors: FieldError[] = [];
  const su = units === 'us' ? 'ft' : 'm';
  if (used.length < 4) errors.push({ field: 'gaugings', text: `Tick at least 4 gaugings with a discharge above 0; ${used.length} ${used.length === 1 ? 'is' : 'are'} ticked.` });
  const lowest_m = Math.min(...used.map((g) => g.meanStage_m));
  const highest_m = Math.max(...used.map((g) => g.meanStage_m));
  let offset_m: number | undefined;
  if (choices.offsetMode === 'fixed') {
    const v = parseDecimal(choices.offsetText);
    if (v === undefined) errors.push({ field: 'offset', text: `Type the fixed offset (stage of zero flow) as a number in ${su}, like 0.12.` });
    else {
      offset_m = fromDisplay('stage', v, units);
      if (used.length > 0 && !(offset_m < lowest_m)) {
        errors.push({ field: 'offset', text: `The offset must be below the lowest ticked gauging’s stage; ${v} ${su} is not.` });
      }
    }
  }
  let breakpoint_m: number | undefined;
  if (choices.segmentCount === 2) {
    const v = parseDecimal(choices.breakpointText);
    if (v === undefined) errors.push({ field: 'breakpoint', text: `Type the breakpoint between the two segments as a stage in ${su}, like 0.80.` });
    else {
      breakpoint_m = fromDisplay('stage', v, units);
      if (used.length > 0 && !(breakpoint_m > lowest_m && breakpoint_m <= highest_m)) {
        errors.push({ field: 'breakpoint', text: `The breakpoint must lie among the ticked gaugings’ stages, above the lowest and not above the highest.` });
      }
    }
  }
  if (errors.length > 0) return { ok: false, errors };
  try {
    const fit = fitSegments(
      used.map((g) => ({ stage_m: g.meanStage_m, discharge_m3s: g.discharge_m3s })),
      { ...(breakpoint_m !== undefined && { breakpoint_m, join: choices.join }), ...(offset_m !== undefined && { offset_m }) },
    );
    return { ok: true, fit, used };
  } catch (err) {
    if (err instanceof RangeError) return { ok: false, errors: [{ field: choices.segmentCount === 2 ? 'breakpoint' : 'gaugings', text: plainFitMessage(err) }] };
    throw err;
  }
}

/** The core's refusal of a fit in words for the screen (web/plain-words.ts, the one translator). */
export function plainFitMessage(err: unknown): string {
  return plainError(err, { fallback: 'These gaugings do not give a rating; check the ticked gaugings and the settings.' });
}

/** A fit warning in the screen's words: "the gauging at index 3" becomes "gauging 4 (counting from the oldest ticked)". */
export function plainFitWarning(warning: string): string {
  return warning.replace(/[Tt]he gauging at index (\d+)/g, (_m, i: string) => `Gauging ${Number(i) + 1} (counting from the oldest ticked)`);
}
