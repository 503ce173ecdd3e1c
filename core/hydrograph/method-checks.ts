// Checks of separation-method settings shared by separateBaseflow and its filter runner.

/** Name used in the messages of separateBaseflow's errors. */
export const SEPARATE_FN = 'separateBaseflow';

/** Throws a RangeError unless x is a number strictly between 0 and 1. */
export function inOpenUnit(x: unknown, what: string): number {
  if (typeof x !== 'number' || !(x > 0 && x < 1)) throw new RangeError(`${SEPARATE_FN} needs ${what} in (0, 1); got ${String(x)}`);
  return x;
}

/** Throws a RangeError unless x is a finite number above 0. */
export function positive(x: unknown, what: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) {
    throw new RangeError(`${SEPARATE_FN} needs ${what} above 0; got ${String(x)}`);
  }
  return x;
}
