// Zoom and pan of a plot's x range as plain arithmetic (no DOM), so the gestures are tested in Node.

/** A visible x range in data units (UTC ms for time axes), min < max. */
export interface XRange {
  min: number;
  max: number;
}

/** Keeps a range inside the data's extent; a range wider than the data becomes the whole extent. */
export function clampRange(range: XRange, extent: XRange): XRange {
  const span = range.max - range.min;
  const full = extent.max - extent.min;
  if (!(span > 0) || span >= full) return { ...extent };
  if (range.min < extent.min) return { min: extent.min, max: extent.min + span };
  if (range.max > extent.max) return { min: extent.max - span, max: extent.max };
  return range;
}

/**
 * The range zoomed by `factor` (above 1 zooms in) so the value at `anchor` (data units) stays where it
 * is on screen; never narrower than minSpan (data units), never outside the extent.
 */
export function zoomAbout(range: XRange, anchor: number, factor: number, extent: XRange, minSpan: number): XRange {
  if (!(factor > 0) || !Number.isFinite(factor)) return range;
  const span = range.max - range.min;
  const next = Math.max(span / factor, Math.min(minSpan, extent.max - extent.min));
  const share = span > 0 ? (anchor - range.min) / span : 0.5;
  return clampRange({ min: anchor - share * next, max: anchor - share * next + next }, extent);
}

/** The range moved by delta (data units; positive shows later values), kept inside the extent. */
export function panBy(range: XRange, delta: number, extent: XRange): XRange {
  return clampRange({ min: range.min + delta, max: range.max + delta }, extent);
}

/**
 * The range during a two-finger pinch: the data value first under the fingers' midpoint stays under the
 * midpoint as it moves, and the span scales by the ratio of the fingers' distances (CSS px).
 */
export function pinchRange(
  start: XRange,
  startMid_px: number,
  startDistance_px: number,
  mid_px: number,
  distance_px: number,
  width_px: number,
  extent: XRange,
  minSpan: number,
): XRange {
  const span = start.max - start.min;
  const factor = distance_px > 0 && startDistance_px > 0 ? distance_px / startDistance_px : 1;
  const next = Math.max(span / factor, Math.min(minSpan, extent.max - extent.min));
  const anchor = start.min + (startMid_px / width_px) * span;
  const min = anchor - (mid_px / width_px) * next;
  return clampRange({ min, max: min + next }, extent);
}
