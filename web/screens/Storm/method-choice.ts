// The separation method the user chose, as typed (Eckhardt's two constants stay text until they read as
// numbers), and the complete core method it stands for, every parameter written out so a saved analysis
// repeats exactly.
import {
  defaultEckhardt,
  defaultSmoothedMinima,
  localMinimumInterval_days,
  methodWithDefaults,
  SEPARATION_FAMILY,
  type SeparationMethod,
} from '../../../core';
import { parseDecimal } from '../../format';
import { METHOD_KINDS, type MethodChoice, type MethodKind } from '../../components/SeparationPicker';

export type { MethodChoice };

/** The first choice: variable slope; Eckhardt's fields start at its published defaults (Eckhardt 2005). */
export const defaultMethodChoice: MethodChoice = {
  kind: 'variable-slope',
  bfiMax: String(defaultEckhardt.bfiMax),
  recession: String(defaultEckhardt.recession),
};

/** True for the methods that draw baseflow between the key points (the others run over the whole window). */
export function usesKeyPoints(kind: MethodKind): boolean {
  return SEPARATION_FAMILY[kind] === 'key-points';
}

/** True for the methods that join the low points of a long record (they need a window of many days). */
export function usesMinima(kind: MethodKind): boolean {
  return SEPARATION_FAMILY[kind] === 'minima';
}

/** A typed constant that must lie strictly between 0 and 1, or the sentence that says what is wrong. */
function unitFraction(text: string, what: string): number | string {
  const v = parseDecimal(text);
  if (v === undefined) return `${what} needs a number between 0 and 1, such as 0.8; "${text}" is not one.`;
  if (!(v > 0 && v < 1)) return `${what} must lie between 0 and 1 (not 0 or 1 themselves); ${v} is outside.`;
  return v;
}

/** The core method for a choice (every parameter written out), or a plain sentence when it cannot be made. */
export function methodFor(choice: MethodChoice, area_km2: number | undefined): { method: SeparationMethod } | { problem: string } {
  if (choice.kind === 'eckhardt') {
    const bfiMax = unitFraction(choice.bfiMax, 'The largest baseflow index (BFImax)');
    if (typeof bfiMax === 'string') return { problem: bfiMax };
    const recession = unitFraction(choice.recession, 'The recession constant');
    if (typeof recession === 'string') return { problem: recession };
    return { method: { kind: 'eckhardt', bfiMax, recession } };
  }
  if (choice.kind === 'local-minimum' && area_km2 === undefined) {
    return { problem: 'The local-minimum method sets its interval from the catchment area: add the area to the site.' };
  }
  return { method: methodWithDefaults(choice.kind, { area_km2 }) };
}

/** The choice that reproduces a saved method (kind and parameters as stored); undefined for an unknown kind. */
export function choiceOf(saved: { kind: string; [parameter: string]: unknown }): MethodChoice | undefined {
  const kind = (METHOD_KINDS as readonly string[]).includes(saved.kind) ? (saved.kind as MethodKind) : undefined;
  if (!kind) return undefined;
  const bfiMax = typeof saved.bfiMax === 'number' ? String(saved.bfiMax) : defaultMethodChoice.bfiMax;
  const recession = typeof saved.recession === 'number' && kind === 'eckhardt' ? String(saved.recession) : defaultMethodChoice.recession;
  return { kind, bfiMax, recession };
}

/**
 * Days of record a minima method needs to find low points on either side of a storm: five of its blocks
 * (smoothed minima, 5-day blocks) or five of its intervals (local minimum). The core refuses fewer than
 * three blocks; five leaves room for a turning point on each side (our choice).
 */
export function minimaWindow_days(kind: MethodKind, area_km2: number | undefined): number | undefined {
  if (kind === 'smoothed-minima') return 5 * defaultSmoothedMinima.block_days;
  if (kind === 'local-minimum' && area_km2 !== undefined) return 5 * localMinimumInterval_days(area_km2);
  return undefined;
}
