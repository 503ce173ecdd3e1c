// Which filter constants have a stated rule for a step other than a day (DOMAIN.md §4).
import { stepLabel } from './filters/time-step';
import { MS_PER_DAY } from './series';

const DAILY_TOLERANCE = 1e-6;

/**
 * Why a method is daily-only on a record with step step_ms (ms), or null when it suits the record. The
 * recession constants of Eckhardt and Chapman–Maxwell convert exactly to any step (c^(Δt/1 day): an
 * exponential recession falls by that factor each step). Lyne–Hollick's α is a filter setting tuned on
 * daily flows (Nathan & McMahon 1990), not a recession constant: no published rule carries it to a shorter
 * step, so on sub-daily records the method is daily-only. Minima methods work on daily means; event
 * methods have no constant.
 */
export function dailyOnlyReason(kind: string, step_ms: number): string | null {
  if (kind !== 'lyne-hollick' || step_ms >= MS_PER_DAY * (1 - DAILY_TOLERANCE)) return null;
  return (
    `Lyne–Hollick's α is set for daily flows and has no established conversion to a ${stepLabel(step_ms)} step; ` +
    `on this record its baseflow is indicative only.`
  );
}
