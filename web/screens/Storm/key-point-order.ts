// Moving one key point of a storm along the readings without breaking the order rise start < peak <
// inflection < end of runoff: a point pushed past a neighbour stops one reading short of it, with a plain
// sentence saying why (never an internal name or a raw millisecond number).
import type { EventPoints } from '../../../core';

/** The key points in their required order. */
export const KEY_ORDER = ['riseStart_ms', 'peak_ms', 'inflection_ms', 'runoffEnd_ms'] as const;

/** A key point's name in EventPoints. */
export type KeyPoint = (typeof KEY_ORDER)[number];

/** Plain names of the key points, as the screen shows them. */
export const KEY_NAMES: Record<KeyPoint, string> = {
  riseStart_ms: 'Rise start',
  peak_ms: 'Peak',
  inflection_ms: 'Inflection',
  runoffEnd_ms: 'End of runoff',
};

/** The key point moved and, when it was stopped at a neighbour, the sentence that says so. */
export interface PointMove {
  points: EventPoints;
  stopped?: string;
}

/** Index of the reading nearest to time_ms (times ascending, UTC ms); binary search. */
export function nearestIndex(time_ms: ArrayLike<number>, at_ms: number): number {
  const n = time_ms.length;
  if (n === 0) return -1;
  let lo = 0;
  let hi = n - 1;
  if (at_ms <= time_ms[0]) return 0;
  if (at_ms >= time_ms[hi]) return hi;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (time_ms[mid] <= at_ms) lo = mid;
    else hi = mid;
  }
  return at_ms - time_ms[lo] <= time_ms[hi] - at_ms ? lo : hi;
}

const lower = (name: string) => name.charAt(0).toLowerCase() + name.slice(1);

/**
 * Moves `key` to the reading nearest target_ms (UTC ms). Its neighbours keep their places: the point stops
 * one reading after the point before it and one reading before the point after it.
 */
export function movePoint(points: EventPoints, key: KeyPoint, target_ms: number, time_ms: ArrayLike<number>): PointMove {
  const n = time_ms.length;
  if (n < 4) return { points, stopped: 'There are too few readings in the window to move the key points.' };
  const k = KEY_ORDER.indexOf(key);
  let i = nearestIndex(time_ms, target_ms);
  let stopped: string | undefined;
  const before = k > 0 ? KEY_ORDER[k - 1] : undefined;
  const after = k < KEY_ORDER.length - 1 ? KEY_ORDER[k + 1] : undefined;
  // Each neighbour is at least one reading from its own neighbours, so there is always room for this point.
  const minIndex = before ? nearestIndex(time_ms, points[before]) + 1 : 0;
  const maxIndex = after ? nearestIndex(time_ms, points[after]) - 1 : n - 1;
  if (before && i < minIndex) {
    i = minIndex;
    stopped = `The ${lower(KEY_NAMES[key])} cannot come before the ${lower(KEY_NAMES[before])}: it stops one reading after it.`;
  } else if (after && i > maxIndex) {
    i = maxIndex;
    stopped = `The ${lower(KEY_NAMES[key])} cannot come after the ${lower(KEY_NAMES[after])}: it stops one reading before it.`;
  }
  i = Math.max(0, Math.min(n - 1, i));
  if (minIndex > maxIndex) return { points, stopped };
  return { points: { ...points, [key]: time_ms[i] }, ...(stopped ? { stopped } : {}) };
}

/** Moves `key` by `steps` readings (negative: earlier), stopping at its neighbours as movePoint does. */
export function stepPoint(points: EventPoints, key: KeyPoint, steps: number, time_ms: ArrayLike<number>): PointMove {
  const i = nearestIndex(time_ms, points[key]);
  const j = Math.max(0, Math.min(time_ms.length - 1, i + steps));
  return movePoint(points, key, time_ms[j], time_ms);
}
