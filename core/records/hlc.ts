// Hybrid logical clock revisions: "<wall ms, 13 digits>-<counter, 6 digits>-<device id>". Fixed widths make
// string order equal to (wall time, counter, device) order, so revisions sort and compare as strings.

/** The parts of a revision: wall time (UTC ms), counter within that millisecond, device id. */
export interface RevParts {
  wall_ms: number;
  counter: number;
  deviceId: string;
}

/** Largest wall time a revision can carry, UTC ms (13 decimal digits: year 2286). */
export const REV_MAX_WALL_MS = 9_999_999_999_999;
/** Largest counter within one millisecond; beyond it the clock moves on by 1 ms. */
export const REV_MAX_COUNTER = 999_999;

const REV = /^(\d{13})-(\d{6})-([A-Za-z0-9_-]{1,64})$/;
const DEVICE = /^[A-Za-z0-9_-]{1,64}$/;

/** Writes a revision string from its parts. */
export function formatRev(parts: RevParts): string {
  const { wall_ms, counter, deviceId } = parts;
  if (!Number.isInteger(wall_ms) || wall_ms < 0 || wall_ms > REV_MAX_WALL_MS) {
    throw new RangeError(`formatRev needs a whole wall time from 0 to ${REV_MAX_WALL_MS} ms; got ${wall_ms}`);
  }
  if (!Number.isInteger(counter) || counter < 0 || counter > REV_MAX_COUNTER) {
    throw new RangeError(`formatRev needs a whole counter from 0 to ${REV_MAX_COUNTER}; got ${counter}`);
  }
  if (!DEVICE.test(deviceId)) {
    throw new RangeError(`formatRev needs a device id of 1–64 letters, digits, '-' or '_'; got ${JSON.stringify(deviceId)}`);
  }
  return `${String(wall_ms).padStart(13, '0')}-${String(counter).padStart(6, '0')}-${deviceId}`;
}

/** Reads a revision string into its parts; throws a RangeError when it is not one. */
export function parseRev(rev: string): RevParts {
  const m = typeof rev === 'string' ? REV.exec(rev) : null;
  if (!m) {
    throw new RangeError(`parseRev needs a revision like "1767225600000-000000-device"; got ${JSON.stringify(rev)}`);
  }
  return { wall_ms: Number(m[1]), counter: Number(m[2]), deviceId: m[3] };
}

/** True when x is a well-formed revision string. */
export function isRev(x: unknown): x is string {
  return typeof x === 'string' && REV.test(x);
}

/**
 * The next revision on device `deviceId` at wall clock now_ms (UTC ms), after `previous` (the highest
 * revision this device has written or seen, from any device). Always sorts above `previous`, even when
 * the wall clock stands still or goes back.
 */
export function nextRev(previous: string | undefined, now_ms: number, deviceId: string): string {
  if (!Number.isFinite(now_ms) || now_ms < 0 || now_ms > REV_MAX_WALL_MS) {
    throw new RangeError(`nextRev needs a clock reading from 0 to ${REV_MAX_WALL_MS} ms; got ${now_ms}`);
  }
  const now = Math.floor(now_ms);
  if (previous === undefined) return formatRev({ wall_ms: now, counter: 0, deviceId });
  const prev = parseRev(previous);
  if (now > prev.wall_ms) return formatRev({ wall_ms: now, counter: 0, deviceId });
  if (prev.counter < REV_MAX_COUNTER) return formatRev({ wall_ms: prev.wall_ms, counter: prev.counter + 1, deviceId });
  return formatRev({ wall_ms: prev.wall_ms + 1, counter: 0, deviceId });
}

/** Orders two revisions: negative when a is older, 0 when equal, positive when a is newer. */
export function compareRev(a: string, b: string): number {
  parseRev(a);
  parseRev(b);
  return a < b ? -1 : a > b ? 1 : 0;
}

/** The newer of two revisions; undefined counts as older than any revision. */
export function maxRev(a: string | undefined, b: string | undefined): string | undefined {
  if (a === undefined) return b;
  if (b === undefined) return a;
  return compareRev(a, b) >= 0 ? a : b;
}
