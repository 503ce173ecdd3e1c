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

/** Rounds to 3 significant figures for printing. */
export function sig3(x: number): number {
  return Number(x.toPrecision(3));
}
