/** Lookups over the track's time axis (seconds from run start, non-decreasing). */

/** First index with t[i] ≥ x (t.length when none). */
export function lowerBound(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index with t[i] > x (t.length when none). */
export function upperBound(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Index of the point nearest time x; the earlier one on a tie; −1 for no points or no time. */
export function nearestIndex(t: ArrayLike<number>, x: number): number {
  if (t.length === 0 || !Number.isFinite(x)) return -1;
  const i = lowerBound(t, x);
  if (i === 0) return 0;
  if (i === t.length) return t.length - 1;
  return x - t[i - 1] <= t[i] - x ? i - 1 : i;
}

/** Inclusive index range of the points with from ≤ t ≤ to, or null when none lie inside. */
export function indexRange(t: ArrayLike<number>, from: number, to: number): [number, number] | null {
  const lo = Math.min(from, to);
  const hi = Math.max(from, to);
  const start = lowerBound(t, lo);
  const end = upperBound(t, hi) - 1;
  return start <= end ? [start, end] : null;
}
