// What a technician should know about a stage reading as it is typed: the discharge from the rating
// in force (with its shift), and plain warnings that never block saving. [DOMAIN.md §1: trade practice]
import { dischargeAtTime, ratingInForce, zeroFlowStage_m, type DatedRating, type StageDischarge } from '../rating/index';
import { stageText, type UnitSystem } from '../units';

/** Kinds of plausibility warning, one sentence each when shown. */
export type ReadingWarningCode = 'no-rating' | 'below-zero-flow' | 'extrapolated' | 'jump' | 'future';

/** One plausibility warning: a code for tests and flags, and the sentence shown and stored. */
export interface ReadingWarning {
  code: ReadingWarningCode;
  text: string;
}

/** What checkReading needs: the stage (m) and time (UTC ms) typed, the clock, the site's limits. */
export interface ReadingCheckInput {
  stage_m: number;
  time_ms: number;
  /** The device clock, UTC ms (core has no clock of its own). */
  now_ms: number;
  /** The site's reading just before time_ms, if any. */
  previous?: { stage_m: number; time_ms: number };
  /** Stage change (m) above which a jump from the previous reading is flagged. */
  jumpLimit_m: number;
  /** The site's ratings (any order; the one in force at time_ms applies, with its dated shifts). */
  ratings: readonly DatedRating[];
  /** Units for the sentences. */
  units: UnitSystem;
}

/** Discharge (m³/s, NaN when no rating is in force), shift (m), extrapolated flag and rating of the reading, and the warnings. */
export interface ReadingCheck extends StageDischarge {
  warnings: ReadingWarning[];
  /**
   * Set when the stage is far outside what the site has seen (DOMAIN.md §1): a question to ask before saving,
   * as for a time far ahead; a reading is never saved on this warning alone.
   */
  slip?: string;
}

/** A stage above this many times the highest gauged stage is taken for a typing slip until confirmed. */
export const SLIP_FACTOR = 2;

/** A time more than this far ahead of the device clock is flagged as in the future (ms). */
export const FUTURE_TOLERANCE_MS = 5 * 60_000;

function durationText(ms: number): string {
  const min = Math.round(ms / 60_000);
  if (min < 90) return `${min} min`;
  const h = ms / 3_600_000;
  return h < 48 ? `${h.toFixed(1)} h` : `${(h / 24).toFixed(1)} days`;
}

/** "12 min earlier", or "just before" when less than a minute apart (never "0 min earlier"). */
function sinceText(ms: number): string {
  return Math.round(ms / 60_000) < 1 ? 'just before' : `${durationText(ms)} earlier`;
}

/** Checks a stage reading and computes its discharge. Throws RangeError for a non-finite stage or time. */
export function checkReading(input: ReadingCheckInput): ReadingCheck {
  const { stage_m, time_ms, now_ms, previous, jumpLimit_m, ratings, units } = input;
  if (!Number.isFinite(stage_m)) throw new RangeError(`checkReading needs a finite stage in m; got ${stage_m}`);
  if (!Number.isFinite(time_ms)) throw new RangeError(`checkReading needs a finite time in UTC ms; got ${time_ms}`);
  if (!Number.isFinite(now_ms)) throw new RangeError(`checkReading needs the clock in UTC ms; got ${now_ms}`);
  if (!(jumpLimit_m > 0)) throw new RangeError(`checkReading needs a jump limit above 0 m; got ${jumpLimit_m}`);
  const warnings: ReadingWarning[] = [];
  const rating = ratingInForce(ratings, time_ms);
  const q = dischargeAtTime(rating ? [rating] : [], time_ms, stage_m);
  if (!rating) {
    warnings.push({ code: 'no-rating', text: 'No rating is in force at this time, so no discharge can be given.' });
  } else if (q.discharge_m3s === 0) {
    warnings.push({
      code: 'below-zero-flow',
      text: `The stage${q.shift_m ? ' with its shift' : ''} is at or below the zero-flow stage of ${stageText(zeroFlowStage_m(rating), units)}: the discharge is 0.`,
    });
  } else if (q.extrapolated) {
    const [lo, hi] = rating.gaugedRange_m!;
    warnings.push({
      code: 'extrapolated',
      text: `The stage is outside the gauged range (${stageText(lo, units)} to ${stageText(hi, units)}): the discharge is extrapolated.`,
    });
  }
  if (previous && Math.abs(stage_m - previous.stage_m) > jumpLimit_m) {
    const d = stage_m - previous.stage_m;
    warnings.push({
      code: 'jump',
      text: `The stage ${d > 0 ? 'rose' : 'fell'} ${stageText(Math.abs(d), units)} since the previous reading ${sinceText(Math.abs(time_ms - previous.time_ms))}, more than this site's limit of ${stageText(jumpLimit_m, units)}. Check the gauge, and note why if it is right.`,
    });
  }
  if (time_ms > now_ms + FUTURE_TOLERANCE_MS) {
    warnings.push({ code: 'future', text: `The time is ${durationText(time_ms - now_ms)} ahead of this phone's clock.` });
  }
  const hi = rating?.gaugedRange_m?.[1];
  const slip =
    hi !== undefined && hi > 0 && stage_m > SLIP_FACTOR * hi
      ? `A stage of ${stageText(stage_m, units)} is more than ${SLIP_FACTOR} times the highest gauged stage (${stageText(hi, units)}). Is it a typing slip? Check the number before saving.`
      : undefined;
  return { ...q, warnings, ...(slip && { slip }) };
}
