// Where the key-point handles sit over the storm plot. Each handle is a 44 px square touch target
// (WCAG 2.1 success criterion 2.5.5). Three tries, the first that leaves no two targets overlapping wins:
//   1. every target on its point (moved only as far as needed to keep the whole square inside the area);
//   2. overlapping targets stacked up and down at their own times, where the stack fits the area's height;
//   3. overlapping targets side by side in time order at their points' heights, each moved as little as it
//      can be (least squares, order kept: isotonic regression by pooling adjacent violators).
// Targets that overlap are moved as a group; a group that then overlaps another target takes it in.
// A target set aside from its point is joined to it by a leader line (drawn by the component). Pure.

/** Side of a handle's square touch target, CSS px (WCAG 2.1 SC 2.5.5 asks at least 44 px). */
export const HANDLE_PX = 44;
/** Clear space kept between two targets, CSS px. */
export const HANDLE_GAP_PX = 4;

/** One handle to place: its key and its point (CSS px in the plot's box; y may be NaN: no value there). */
export interface HandleWish<K extends string> {
  key: K;
  x: number;
  y: number;
}

/** A placed handle: the centre of its target and the point it stands for (CSS px). */
export interface HandleSpot<K extends string> {
  key: K;
  x: number;
  y: number;
  pointX: number;
  pointY: number;
}

/** The plotting area (CSS px in the plot's box). */
export interface HandleArea {
  left: number;
  top: number;
  width: number;
  height: number;
}

const STEP = HANDLE_PX + HANDLE_GAP_PX;

/** Whether two targets centred at a and b come closer than the clear space between them. */
export function targetsOverlap(a: { x: number; y: number }, b: { x: number; y: number }): boolean {
  return Math.abs(a.x - b.x) < STEP - 1e-9 && Math.abs(a.y - b.y) < STEP - 1e-9;
}

function anyOverlap(spots: readonly { x: number; y: number }[]): boolean {
  for (let a = 0; a < spots.length; a++) for (let b = a + 1; b < spots.length; b++) if (targetsOverlap(spots[a], spots[b])) return true;
  return false;
}

/** Values in order moved as little as possible (least squares) so that each is at least `gap` after the one before. */
function spreadInOrder(values: readonly number[], gap: number, min: number, max: number): number[] {
  // Pool adjacent violators on z_i = v_i − i·gap (nondecreasing z means gaps of at least `gap`).
  const blocks: { sum: number; n: number }[] = [];
  values.forEach((v, i) => {
    blocks.push({ sum: v - i * gap, n: 1 });
    while (blocks.length > 1 && blocks[blocks.length - 2].sum / blocks[blocks.length - 2].n > blocks[blocks.length - 1].sum / blocks[blocks.length - 1].n) {
      const last = blocks.pop()!;
      blocks[blocks.length - 1].sum += last.sum;
      blocks[blocks.length - 1].n += last.n;
    }
  });
  const z: number[] = [];
  for (const b of blocks) for (let k = 0; k < b.n; k++) z.push(b.sum / b.n);
  // The same bounds for every z keep the order; they put the first at or after min and the last at or before max.
  const hi = Math.max(min, max - (values.length - 1) * gap);
  return z.map((zi, i) => Math.min(hi, Math.max(min, zi)) + i * gap);
}

type Spot<K extends string> = HandleSpot<K>;

/**
 * Moves overlapping targets apart along one axis, group by group: targets that overlap form a group,
 * each group of two or more is spread (`spread` gives the new coordinates of its members), and a group
 * that then overlaps another is joined to it and spread again. Undefined when a group cannot fit (`fits`).
 */
function apartByGroups<K extends string>(
  start: readonly Spot<K>[],
  fits: (n: number) => boolean,
  spread: (members: Spot<K>[]) => void,
): Spot<K>[] | undefined {
  const group = start.map((_, k) => k);
  const root = (k: number): number => (group[k] === k ? k : (group[k] = root(group[k])));
  const join = (a: number, b: number) => (group[root(a)] = root(b));
  for (let a = 0; a < start.length; a++) for (let b = a + 1; b < start.length; b++) if (targetsOverlap(start[a], start[b])) join(a, b);
  for (;;) {
    const spots = start.map((s) => ({ ...s }));
    const members = new Map<number, Spot<K>[]>();
    spots.forEach((s, k) => members.set(root(k), [...(members.get(root(k)) ?? []), s]));
    for (const m of members.values()) {
      if (!fits(m.length)) return undefined;
      if (m.length > 1) spread(m);
    }
    let joined = false;
    for (let a = 0; a < spots.length; a++) for (let b = a + 1; b < spots.length; b++) {
      if (root(a) !== root(b) && targetsOverlap(spots[a], spots[b])) {
        join(a, b);
        joined = true;
      }
    }
    if (!joined) return spots;
  }
}

/**
 * Places the targets of `wishes` (given in time order) inside `area`: see the file's opening comment.
 * Never overlapping when the area is at least one target high and as wide as all targets side by side
 * with their clear space (4 × 48 − 4 = 188 px for the four key points).
 */
export function placeHandles<K extends string>(wishes: readonly HandleWish<K>[], area: HandleArea): HandleSpot<K>[] {
  const half = HANDLE_PX / 2;
  const minX = area.left + half;
  const maxX = Math.max(minX, area.left + area.width - half);
  const minY = area.top + half;
  const maxY = Math.max(minY, area.top + area.height - half);
  const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
  const points = wishes.map((w) => {
    const pointY = Number.isFinite(w.y) ? clamp(w.y, area.top, area.top + area.height) : area.top + area.height;
    return { key: w.key, pointX: w.x, pointY, x: clamp(w.x, minX, maxX), y: clamp(pointY, minY, maxY) };
  });

  // 1. On the points.
  if (!anyOverlap(points)) return points;

  // 2. Overlapping targets stacked up and down at their own times, in the order of their points' heights.
  const stacked = apartByGroups(
    points,
    (n) => n * STEP - HANDLE_GAP_PX <= area.height,
    (m) => {
      m.sort((a, b) => a.y - b.y);
      spreadInOrder(m.map((s) => s.y), STEP, minY, maxY).forEach((y, k) => (m[k].y = y));
    },
  );
  if (stacked) return stacked;

  // 3. Overlapping targets side by side in time order, each at its point's height (all four side by side
  //    at the most, which fits any area at least 188 px wide).
  const order = new Map(points.map((p, k) => [p.key, k]));
  const sideways = apartByGroups(
    points,
    () => true,
    (m) => {
      m.sort((a, b) => order.get(a.key)! - order.get(b.key)!);
      spreadInOrder(m.map((s) => s.x), STEP, minX, maxX).forEach((x, k) => (m[k].x = x));
    },
  );
  return sideways!;
}
