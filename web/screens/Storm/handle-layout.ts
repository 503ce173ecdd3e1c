// Where the key-point handles sit on the plot: centred on their time, on the discharge line when there is
// room, always wholly inside the plotting area, and never over one another (a handle that would overlap
// one already placed moves up or down by whole handle heights, and a stem joins it to its point). Pure.

/** Side of a handle's square touch target, CSS px (WCAG 2.5.5 asks 44 px). */
export const HANDLE_PX = 44;
/** Clear space kept between two handles, CSS px. */
export const HANDLE_GAP_PX = 4;

/** One handle to place: its key, x of its time and y of its point on the line (CSS px; y may be NaN). */
export interface HandleWish<K extends string> {
  key: K;
  x: number;
  y: number;
}

/** A placed handle: its centre (CSS px) and the point it stands for (its stem runs there). */
export interface HandleSpot<K extends string> {
  key: K;
  x: number;
  y: number;
  pointX: number;
  pointY: number;
}

/**
 * Places handles in the area (CSS px): each centre starts on its point, clamped so the whole 44 px
 * square is inside the area. Handles whose columns come within 44 + HANDLE_GAP_PX of each other (joined
 * through neighbours) are stacked in the order of their points, top to bottom, pushed apart by whole
 * handle heights and then pulled back inside the area from the bottom. When a stack is taller than the
 * area, the handles are spread sideways instead (four need an area at least 188 px wide).
 */
export function placeHandles<K extends string>(wishes: readonly HandleWish<K>[], area: { left: number; top: number; width: number; height: number }): HandleSpot<K>[] {
  const half = HANDLE_PX / 2;
  const step = HANDLE_PX + HANDLE_GAP_PX;
  const minY = area.top + half;
  const maxY = Math.max(minY, area.top + area.height - half);
  const clampY = (y: number) => Math.min(maxY, Math.max(minY, y));
  const spots = wishes.map((w) => {
    const pointY = Number.isFinite(w.y) ? clampY(w.y) : maxY;
    return { key: w.key, x: w.x, y: pointY, pointX: w.x, pointY };
  });
  // Columns: handles joined by horizontal closeness, found by walking them in x order.
  const byX = [...spots].sort((a, b) => a.x - b.x);
  const columns: (typeof spots)[] = [];
  for (const s of byX) {
    const last = columns[columns.length - 1];
    if (last && s.x - last[last.length - 1].x < step) last.push(s);
    else columns.push([s]);
  }
  // A column taller than the area cannot stack: then every handle keeps its height and they are spread
  // sideways instead, in time order, a handle width apart (the stem shows the time each stands for).
  if (columns.some((c) => c.length * step - HANDLE_GAP_PX > area.height)) {
    const right = area.left + area.width;
    for (let i = 1; i < byX.length; i++) byX[i].x = Math.max(byX[i].x, byX[i - 1].x + step);
    byX[byX.length - 1].x = Math.min(byX[byX.length - 1].x, right);
    for (let i = byX.length - 2; i >= 0; i--) byX[i].x = Math.min(byX[i].x, byX[i + 1].x - step);
    for (const s of byX) s.x = Math.max(s.x, area.left);
    return spots;
  }
  for (const column of columns) {
    if (column.length < 2) continue;
    column.sort((a, b) => a.pointY - b.pointY);
    for (let i = 1; i < column.length; i++) column[i].y = Math.max(column[i].y, column[i - 1].y + step);
    column[column.length - 1].y = Math.min(column[column.length - 1].y, maxY);
    for (let i = column.length - 2; i >= 0; i--) column[i].y = Math.min(column[i].y, column[i + 1].y - step);
    for (const s of column) s.y = Math.max(s.y, minY);
  }
  return spots;
}
