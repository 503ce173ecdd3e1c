// Pinch zoom and pan of the full view by pointer events: two pointers scale about their midpoint's
// travel, one pointer pans a zoomed picture, the wheel and buttons step the scale. Pure state changes,
// so the rules are tested in Node.

/** How the picture is shown: scale (1 = fitted) and offset from the centre, CSS px. */
export interface ZoomView {
  scale: number;
  x: number;
  y: number;
}

export const MIN_SCALE = 1;
export const MAX_SCALE = 8;
export const FITTED: ZoomView = { scale: 1, x: 0, y: 0 };

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** A point of a pointer, CSS px. */
export interface Point {
  x: number;
  y: number;
}

const dist = (a: Point, b: Point) => Math.hypot(a.x - b.x, a.y - b.y);
const mid = (a: Point, b: Point): Point => ({ x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 });

/** The view during a pinch that started at `from` with the two pointers at a0, b0, now at a1, b1. */
export function pinched(from: ZoomView, a0: Point, b0: Point, a1: Point, b1: Point): ZoomView {
  const d0 = dist(a0, b0);
  if (!(d0 > 0)) return from;
  const scale = clamp((from.scale * dist(a1, b1)) / d0, MIN_SCALE, MAX_SCALE);
  if (scale === MIN_SCALE) return FITTED;
  const m0 = mid(a0, b0);
  const m1 = mid(a1, b1);
  return { scale, x: from.x + (m1.x - m0.x), y: from.y + (m1.y - m0.y) };
}

/** The view after one pointer moved by (dx, dy): a fitted picture stays put. */
export function panned(from: ZoomView, dx: number, dy: number): ZoomView {
  return from.scale <= MIN_SCALE ? FITTED : { ...from, x: from.x + dx, y: from.y + dy };
}

/** The view one step in (factor > 1) or out (factor < 1). */
export function stepped(from: ZoomView, factor: number): ZoomView {
  const scale = clamp(from.scale * factor, MIN_SCALE, MAX_SCALE);
  if (scale === MIN_SCALE) return FITTED;
  const k = scale / from.scale;
  return { scale, x: from.x * k, y: from.y * k };
}

/** The CSS transform of a view. */
export function transformOf(v: ZoomView): string {
  return `translate(${v.x}px, ${v.y}px) scale(${v.scale})`;
}
