// The drawing's view: pixels per millimetre (zoom) and the horizontal pan, with "fit all".
import type { BenchElement } from "@/lib/bench/schema";

export type View = { pxPerMm: number; panPx: number };

export const MIN_PX_PER_MM = 0.005;
export const MAX_PX_PER_MM = 40;

export const clampScale = (pxPerMm: number): number => Math.min(MAX_PX_PER_MM, Math.max(MIN_PX_PER_MM, pxPerMm));

/** Scale and pan that show every element with a margin; an empty bench shows the first metre. */
export function fitAll(elements: readonly BenchElement[], widthPx: number): View {
  const positions = elements.map((e) => e.positionMm);
  let from = positions.length ? Math.min(...positions) : 0;
  let to = positions.length ? Math.max(...positions) : 1000;
  if (to - from < 200) {
    const mid = (from + to) / 2;
    from = mid - 100;
    to = mid + 100;
  }
  const marginPx = 80;
  const pxPerMm = clampScale((widthPx - 2 * marginPx) / (to - from));
  return { pxPerMm, panPx: marginPx - from * pxPerMm };
}

/** Zoom by a factor about a point of the canvas (px from its left edge). */
export function zoomAbout(view: View, factor: number, anchorPx: number): View {
  const next = clampScale(view.pxPerMm * factor);
  const mm = (anchorPx - view.panPx) / view.pxPerMm;
  return { pxPerMm: next, panPx: anchorPx - mm * next };
}

/** The millimetre under a canvas x coordinate. */
export const mmAt = (view: View, xPx: number): number => (xPx - view.panPx) / view.pxPerMm;

/**
 * Two-finger pinch: the scale follows the ratio of the finger distances since the pinch began, and the millimetre
 * that was under the fingers' midpoint stays under it (so moving both fingers also pans).
 */
export function pinchZoom(start: View, startDistancePx: number, startCentrePx: number, distancePx: number, centrePx: number): View {
  if (!(startDistancePx > 0) || !(distancePx > 0)) return start;
  const next = clampScale(start.pxPerMm * (distancePx / startDistancePx));
  const mm = mmAt(start, startCentrePx);
  return { pxPerMm: next, panPx: centrePx - mm * next };
}

/** Distance and horizontal midpoint of two touch points (px, relative to the same origin). */
export function touchPair(a: { x: number; y: number }, b: { x: number; y: number }): { distancePx: number; centrePx: number } {
  return { distancePx: Math.hypot(a.x - b.x, a.y - b.y), centrePx: (a.x + b.x) / 2 };
}
