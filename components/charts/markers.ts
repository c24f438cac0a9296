/** Hit-testing and drawing geometry of the event bands (pure). */

export type MarkerTone = "act" | "watch" | "info";

export interface BandMarker {
  id: number;
  startS: number;
  endS: number;
  tone: MarkerTone;
}

/** Bands narrower than this are drawn (and hit) this wide, CSS px, so a 0.1 s dropout is visible. */
export const MIN_BAND_PX = 3;

/**
 * The marker under time `t`, with `toleranceS` of slack for thin bands. Where bands overlap, the
 * selected one wins (so a click does not jump away from it), then the narrowest (the most specific).
 */
export function markerAtTime<M extends BandMarker>(markers: readonly M[], t: number, toleranceS = 0, selectedId: number | null = null): M | null {
  if (!Number.isFinite(t)) return null;
  let best: M | null = null;
  for (const m of markers) {
    const lo = Math.min(m.startS, m.endS) - toleranceS;
    const hi = Math.max(m.startS, m.endS) + toleranceS;
    if (t < lo || t > hi) continue;
    if (m.id === selectedId) return m;
    if (best == null || Math.abs(m.endS - m.startS) < Math.abs(best.endS - best.startS)) best = m;
  }
  return best;
}

/**
 * A band's horizontal extent in pixels, clipped to the plot [left, left + width] and widened to
 * `minPx` around its centre. Null when it lies outside the plot.
 */
export function bandPixels(x0: number, x1: number, left: number, width: number, minPx: number): { x: number; w: number } | null {
  let a = Math.min(x0, x1);
  let b = Math.max(x0, x1);
  if (b - a < minPx) {
    const c = (a + b) / 2;
    a = c - minPx / 2;
    b = c + minPx / 2;
  }
  const lo = Math.max(a, left);
  const hi = Math.min(b, left + width);
  if (hi <= lo) return null;
  return { x: lo, w: hi - lo };
}
