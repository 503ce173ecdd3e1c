// The recursive filters as specifications: checked settings, the note about the time step, and how to run.
import { chapmanMaxwell, chapmanMaxwellCoefficients } from './filters/chapman-maxwell';
import { eckhardt, eckhardtCoefficients } from './filters/eckhardt';
import { firstOrderFilterChecked, type PassFollower } from './filters/first-order';
import { lyneHollick, lyneHollickChecked } from './filters/lyne-hollick';
import { perStep, perStepNote } from './filters/time-step';
import { inOpenUnit, SEPARATE_FN } from './method-checks';
import { defaultLyneHollick } from './methods';
import { MS_PER_DAY } from './series';

/** A recursive filter ready to run on a regular record with step step_ms; its constants are per day. */
export interface FilterSpec {
  name: string;
  /** One plain sentence saying how the per-day constant was applied at the step. */
  note(step_ms: number): string;
  /** Baseflow (m³/s) of a regular, gap-free record with the given step. */
  run(q: Float64Array, step_ms: number): Float64Array;
  /**
   * The same on the caller's arrays, checking the record in the filter's own loop; null unless the record is
   * clean (finite ascending times, finite discharges ≥ 0) and regular with step step_ms. A filter that works
   * in stretches tells `follower` how far it got after each.
   */
  runChecked(t: Float64Array, q: Float64Array, step_ms: number, follower: PassFollower): Float64Array | null;
}

/** The recursive filter methods of SeparationMethod. */
export type FilterMethod =
  | { kind: 'lyne-hollick'; alpha?: number; passes?: number }
  | { kind: 'eckhardt'; bfiMax: number; recession: number }
  | { kind: 'chapman-maxwell'; recession: number };

/** Readings reflected at each end by Lyne–Hollick: 30 values on daily or coarser data, 30 days of readings below. */
export function reflectedReadings(step_ms: number): number {
  const values = defaultLyneHollick.reflect;
  return step_ms >= MS_PER_DAY ? values : Math.round((values * MS_PER_DAY) / step_ms);
}

/** Checks a filter method's settings (RangeError naming the bad one) and returns how to run it. */
export function filterSpec(method: FilterMethod): FilterSpec {
  switch (method.kind) {
    case 'lyne-hollick': {
      const alpha = inOpenUnit(method.alpha ?? defaultLyneHollick.alpha, 'lyne-hollick alpha');
      const passes = method.passes ?? defaultLyneHollick.passes;
      if (!Number.isInteger(passes) || passes < 1 || passes > 9) {
        throw new RangeError(`${SEPARATE_FN} needs lyne-hollick passes as an integer from 1 to 9; got ${String(passes)}`);
      }
      return {
        name: 'Lyne–Hollick',
        note: (step) => perStepNote('Lyne–Hollick α', alpha, step),
        run: (q, step) => lyneHollick(q, perStep(alpha, step), passes, reflectedReadings(step)),
        runChecked: (t, q, step) => lyneHollickChecked(t, q, perStep(alpha, step), passes, reflectedReadings(step)),
      };
    }
    case 'eckhardt': {
      const { bfiMax } = method;
      if (typeof bfiMax !== 'number' || !(bfiMax > 0 && bfiMax <= 1)) {
        throw new RangeError(`${SEPARATE_FN} needs eckhardt bfiMax in (0, 1]; got ${String(bfiMax)}`);
      }
      const a = inOpenUnit(method.recession, 'eckhardt recession');
      return {
        name: 'Eckhardt',
        note: (step) => perStepNote('Recession constant', a, step),
        run: (q, step) => eckhardt(q, bfiMax, perStep(a, step)),
        runChecked: (t, q, step, follower) => {
          const { drain, gain } = eckhardtCoefficients(bfiMax, perStep(a, step));
          return firstOrderFilterChecked(t, q, drain, gain, bfiMax, follower);
        },
      };
    }
    case 'chapman-maxwell': {
      const k = inOpenUnit(method.recession, 'chapman-maxwell recession');
      return {
        name: 'Chapman–Maxwell',
        note: (step) => perStepNote('Recession constant', k, step),
        run: (q, step) => chapmanMaxwell(q, perStep(k, step)),
        runChecked: (t, q, step, follower) => {
          const { drain, gain } = chapmanMaxwellCoefficients(perStep(k, step));
          return firstOrderFilterChecked(t, q, drain, gain, 0.5, follower);
        },
      };
    }
    default: {
      const unknown: never = method;
      throw new RangeError(`${SEPARATE_FN} needs a known filter kind; got ${JSON.stringify((unknown as { kind?: unknown })?.kind)}`);
    }
  }
}
