/**
 * Keyboard and button pan/zoom arithmetic for the time charts. A range is seconds from run start;
 * `null` means the whole run [0, durationS]. Everything is clamped to the run.
 */

export interface TimeRange {
  from: number;
  to: number;
}

/** Share of the visible span one ← / → press moves. */
export const PAN_FRACTION = 0.25;
/** Span multiplier of one + press (− uses the inverse). */
export const ZOOM_IN_FACTOR = 0.5;
/** Narrowest zoom, s: narrower shows only a sample or two even at 10 Hz. */
export const MIN_SPAN_S = 1;

/** The narrowest span allowed for a run (never wider than the run itself). */
export function minSpanFor(durationS: number): number {
  return Math.min(MIN_SPAN_S, Math.max(durationS, 0));
}

/**
 * Orders, widens to the minimum span and shifts a range inside [0, durationS] (keeping its span
 * where it fits). Returns null when it covers the whole run, so "whole run" has one spelling.
 */
export function clampRange(r: TimeRange | null, durationS: number): TimeRange | null {
  if (r == null || !(durationS > 0) || !Number.isFinite(r.from) || !Number.isFinite(r.to)) return null;
  let from = Math.min(r.from, r.to);
  let to = Math.max(r.from, r.to);
  const minSpan = minSpanFor(durationS);
  if (to - from < minSpan) {
    const mid = (from + to) / 2;
    from = mid - minSpan / 2;
    to = mid + minSpan / 2;
  }
  const span = Math.min(to - from, durationS);
  if (from < 0) {
    from = 0;
    to = span;
  }
  if (to > durationS) {
    to = durationS;
    from = Math.max(0, durationS - span);
  }
  if (from <= 0 && to >= durationS) return null;
  return { from, to };
}

/** The range actually shown: the given one, or the whole run. */
export function effectiveRange(r: TimeRange | null, durationS: number): TimeRange {
  return r ?? { from: 0, to: Math.max(durationS, 0) };
}

/** Moves the view by `fraction` of its span (negative = earlier). The whole run cannot pan. */
export function panRange(r: TimeRange | null, direction: -1 | 1, durationS: number, fraction = PAN_FRACTION): TimeRange | null {
  if (r == null) return null;
  const span = r.to - r.from;
  const shift = direction * span * fraction;
  let from = r.from + shift;
  let to = r.to + shift;
  // Stop at the run's ends without shrinking the span.
  if (from < 0) {
    to -= from;
    from = 0;
  }
  if (to > durationS) {
    from -= to - durationS;
    to = durationS;
  }
  return clampRange({ from, to }, durationS);
}

/**
 * Scales the span by `factor` (< 1 zooms in) around `centre` (default: the middle of the view),
 * keeping the centre where it is on screen when the run's ends allow.
 */
export function zoomRange(r: TimeRange | null, factor: number, durationS: number, centre?: number): TimeRange | null {
  if (!(factor > 0) || !(durationS > 0)) return r;
  const cur = effectiveRange(r, durationS);
  const c = centre ?? (cur.from + cur.to) / 2;
  const span = cur.to - cur.from;
  const newSpan = Math.max(span * factor, minSpanFor(durationS));
  // Keep the centre at the same relative position inside the view.
  const rel = span > 0 ? (c - cur.from) / span : 0.5;
  const from = c - rel * newSpan;
  return clampRange({ from, to: from + newSpan }, durationS);
}

export type RangeKeyResult = { handled: false } | { handled: true; range: TimeRange | null };

/** What a key press on the focused chart group does to the range. */
export function rangeForKey(key: string, r: TimeRange | null, durationS: number): RangeKeyResult {
  switch (key) {
    case "ArrowLeft":
      return { handled: true, range: panRange(r, -1, durationS) };
    case "ArrowRight":
      return { handled: true, range: panRange(r, 1, durationS) };
    case "+":
    case "=": // the unshifted + key on most layouts
    case "Add":
      return { handled: true, range: zoomRange(r, ZOOM_IN_FACTOR, durationS) };
    case "-":
    case "_":
    case "Subtract":
      return { handled: true, range: zoomRange(r, 1 / ZOOM_IN_FACTOR, durationS) };
    case "0":
    case "Escape":
      return { handled: true, range: null };
    default:
      return { handled: false };
  }
}

/** Equal within a small tolerance (scale values go through pixel maths). */
export function rangesEqual(a: TimeRange | null, b: TimeRange | null, epsS = 1e-6): boolean {
  if (a == null || b == null) return a == b;
  return Math.abs(a.from - b.from) <= epsS && Math.abs(a.to - b.to) <= epsS;
}
