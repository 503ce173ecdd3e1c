// Filter constants published per day, applied at a record's own time step.
import { MS_PER_DAY } from '../series';

/**
 * A constant per day (0 < c < 1) as the constant per step of step_ms: c^(Δt / 1 day). For a recession
 * constant this is exact: an exponential recession Q = Q₀·c^t (t in days) falls by c^(Δt/1 day) each step.
 * A daily step gives c itself.
 */
export function perStep(perDay: number, step_ms: number): number {
  return step_ms === MS_PER_DAY ? perDay : Math.pow(perDay, step_ms / MS_PER_DAY);
}

/** A time step (ms) in words for notes: "15-min", "1-h", "1-day", "2.5-h". */
export function stepLabel(step_ms: number): string {
  const units: [number, string][] = [
    [MS_PER_DAY, 'day'],
    [3_600_000, 'h'],
    [60_000, 'min'],
    [1000, 's'],
  ];
  for (const [size, name] of units) {
    if (step_ms >= size || size === 1000) return `${Number((step_ms / size).toPrecision(4))}-${name}`;
  }
  return `${step_ms}-ms`;
}

/** A constant close to 1 written with enough decimals to show how far below 1 it is (at least six). */
export function formatConstant(c: number): string {
  const below = 1 - c;
  const decimals = below > 0 ? Math.max(6, Math.ceil(-Math.log10(below)) + 2) : 6;
  return c.toFixed(Math.min(decimals, 15));
}

/** One plain sentence saying how a per-day constant was applied at the record's step. */
export function perStepNote(what: string, perDay: number, step_ms: number): string {
  if (step_ms === MS_PER_DAY) return `${what} ${perDay} per day applied as is to the daily readings.`;
  return `${what} ${perDay} per day applied as ${formatConstant(perStep(perDay, step_ms))} per ${stepLabel(step_ms)} step.`;
}
