// Element geometry in the page for layout checks: boxes by selector, intersection, and whether text
// runs onto more than one line. Rectangles are the browser's own (getBoundingClientRect, Range rects).
import type { Page } from 'playwright-core';

/** A box in CSS px, as getBoundingClientRect gives it. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Whether two boxes share any area (touching edges do not count). */
export function intersects(a: Box, b: Box): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/** Whether inner lies within outer, to within tolerance px. */
export function within(inner: Box, outer: Box, tolerance = 0.5): boolean {
  return inner.x >= outer.x - tolerance && inner.y >= outer.y - tolerance && inner.x + inner.width <= outer.x + outer.width + tolerance && inner.y + inner.height <= outer.y + outer.height + tolerance;
}

/** The boxes of every element matching selector, in document order. */
export function boxes(page: Page, selector: string): Promise<Box[]> {
  return page.$$eval(selector, (els) => els.map((e) => {
    const r = e.getBoundingClientRect();
    return { x: r.x, y: r.y, width: r.width, height: r.height };
  }));
}

/** The text of each element matching selector that runs onto more than one line (by its line boxes). */
export function wrappedTexts(page: Page, selector: string): Promise<string[]> {
  return page.$$eval(selector, (els) => els.flatMap((e) => {
    const range = document.createRange();
    range.selectNodeContents(e);
    const tops = new Set([...range.getClientRects()].filter((r) => r.width > 0).map((r) => Math.round(r.top)));
    return tops.size > 1 ? [e.textContent ?? ''] : [];
  }));
}
