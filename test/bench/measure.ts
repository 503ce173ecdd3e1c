// Small timing helpers for the benchmark: figures are printed as JSON lines, never asserted.
import { performance } from 'node:perf_hooks';

/** Prints one benchmark figure as a JSON line on stdout. */
export function emit(figure: Record<string, unknown>): void {
  process.stdout.write(JSON.stringify(figure) + '\n');
}

/** Median wall time of `fn` in milliseconds over `runs` runs, after `warmup` unmeasured runs. */
export function medianMs(fn: () => unknown, runs = 15, warmup = 3): number {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

/** The median of `xs` (the upper middle one of an even count). */
export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Rounds to 3 significant figures for printing. */
export function sig3(x: number): number {
  return Number(x.toPrecision(3));
}

/** One benchmark figure with its floor measured in the same run: value, floor, value / floor and the target. */
export interface Figure {
  /** Stable name of the figure. */
  name: string;
  value: number;
  unit: string;
  /** The same kind of work done the plainest way, measured in the same run (same unit). */
  floor: number;
  /** What the floor is, in a few words. */
  floor_is: string;
  /** The target as text, e.g. "ratio <= 2" or "value < 5 ms". */
  target: string;
  [extra: string]: unknown;
}

/** Prints a figure as one JSON line: name, value, unit, floor, what the floor is, ratio (value / floor), target, extras. */
export function figure(f: Figure): void {
  const { name, value, unit, floor, floor_is, target, ...extra } = f;
  emit({ name, value: sig3(value), unit, floor: sig3(floor), floor_is, ratio: sig3(value / floor), target, ...extra });
}

/** Prints a line naming a figure that was not measured in this run, and why. */
export function skipped(name: string, reason: string): void {
  emit({ name, skipped: reason });
}
