// Words for a rating on screen: its segments as formulas and its gauged range, in the site's units.
import { displayUnit, type RatingSegment, type UnitSystem } from '../../../core';
import { formatQuantity } from '../../format';
import { coefficientFromSi } from './units';

/** Segment i of a rating as "from 0.800 m: Q = 9.12·(h − 0.300)^1.600" in the site's units ("below …" for the first of several). */
export function segmentFormula(segments: readonly RatingSegment[], i: number, units: UnitSystem): string {
  const s = segments[i];
  const c = coefficientFromSi(s.coefficient, s.exponent, units);
  const e = formatQuantity('stage', Math.abs(s.offset_m), units).replace(/ .*$/, '');
  const where = segments.length === 1 ? '' : i === 0 ? `below ${formatQuantity('stage', segments[1].fromStage_m, units)}: ` : `from ${formatQuantity('stage', s.fromStage_m, units)}: `;
  return `${where}Q = ${Number(c.toPrecision(4))}·(h ${s.offset_m < 0 ? '+' : '−'} ${e})^${s.exponent.toFixed(3)}`;
}

/** "gauged 0.260 m to 1.420 m" or "no gauged range". */
export function rangeText(range: [number, number] | undefined, units: UnitSystem): string {
  return range ? `gauged ${formatQuantity('stage', range[0], units)} to ${formatQuantity('stage', range[1], units)}` : 'no gauged range given';
}

/** Unit labels of a site: stage and discharge. */
export function unitLabels(units: UnitSystem): { su: string; qu: string } {
  return { su: displayUnit('stage', units), qu: displayUnit('discharge', units) };
}
