// Back-pressure for pushes: a cap on the pushes the receiver holds at once (reading the body, waiting for
// the database, storing). A push beyond the cap is answered at once with 503 and Retry-After, before its
// body is read, so nothing of it is stored and the memory a burst of phones can take stays bounded by
// the cap times the largest bundle. Phones wait as told and send the same bundle again (same id), so a
// refused push costs one round trip, never a record.

/** Pushes held at once by default: above the 50 phones of an office's busiest minute, well below memory trouble. */
export const DEFAULT_MAX_PUSHES = 64;

/** Longest wait a refusal asks for, seconds. */
const MAX_RETRY_AFTER_S = 60;

/** A cap on pushes in progress, with a wait to suggest when it is reached. */
export interface PushGate {
  /** Most pushes held at once. */
  readonly limit: number;
  /** Pushes held now. */
  readonly held: number;
  /** Takes a place for one push; returns the function that gives it back (call once), or null when full. */
  tryEnter(): (() => void) | null;
  /** Whole seconds a refused phone should wait: about how long a held push lasts now, 1 to 60. */
  retryAfterSeconds(): number;
}

/** Makes a gate holding at most `limit` pushes (a whole number from 1). */
export function createPushGate(limit: number = DEFAULT_MAX_PUSHES): PushGate {
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError(`The cap on pushes at once must be a whole number from 1; got ${limit}`);
  let held = 0;
  // Moving average of how long a held push lasts, ms; starts at a guess and follows what is measured.
  let averageMs = 50;
  return {
    limit,
    get held() {
      return held;
    },
    tryEnter() {
      if (held >= limit) return null;
      held++;
      const start = Date.now();
      let done = false;
      return () => {
        if (done) return;
        done = true;
        held--;
        averageMs += 0.1 * (Date.now() - start - averageMs);
      };
    },
    retryAfterSeconds() {
      // Pushes are stored one at a time, so a held push lasts about as long as the queue ahead of it takes
      // to clear: by then the pushes held now are through.
      return Math.min(MAX_RETRY_AFTER_S, Math.max(1, Math.ceil(averageMs / 1000)));
    },
  };
}
