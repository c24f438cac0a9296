/**
 * Runs of samples where a condition holds, measured in seconds — the building block of every
 * duration-gated event (link fade, link lost, low voltage, off-route).
 */

/** One run of samples. Indices are inclusive; times in seconds on the series' `tS` clock. */
export interface Span {
  /** First sample inside the span. */
  startIndex: number;
  /** Last sample inside the span (inclusive). */
  endIndex: number;
  /** `tS[startIndex]`, s. */
  startS: number;
  /**
   * Time of the first sample after the span (the one that ended it), s; the last sample's own
   * time when the span runs to the end of the log or up to a gap (unobserved time is not claimed).
   */
  endS: number;
}

export interface FindSpansOptions {
  /** Spans shorter than this (s) are dropped; a span of exactly this length is kept. */
  minDurationS: number;
  /**
   * Hysteresis: once inside a span, stay until `exit(i)` is true (default: until `predicate(i)` is
   * false). Sample `i` where it becomes true is the first sample after the span.
   */
  exit?: (i: number) => boolean;
  /** True at a sample that starts a new reception segment (e.g. `segmentStart[i] === 1`). */
  breakBefore?: (i: number) => boolean;
  /** A time step longer than this (s) is a gap, like `breakBefore`. Default: no limit. */
  maxGapS?: number;
  /**
   * Debounce for use with `exit`: a span is kept only when it holds a run of consecutive samples
   * where `predicate` is true lasting at least this long (s; from the run's first sample to the
   * sample after it). With hysteresis alone, a value hovering inside the dead band would keep a span
   * open on one noisy sample; this asks for the condition itself to last. Default 0.
   */
  confirmS?: number;
}

/** Durations are compared with this slack (s) so 10 Hz clocks like 0.1·i keep exact boundaries. */
export const SPAN_EPSILON_S = 1e-9;

/**
 * Finds the spans of consecutive samples where `predicate` holds (entering) until `exit` holds
 * (leaving), keeping those lasting at least `opts.minDurationS`.
 *
 * Gaps: samples with a non-finite `tS` are skipped (they neither open, extend nor close a span).
 * A break — `breakBefore(i)`, a step longer than `maxGapS`, or time running backwards — closes an
 * open span at its last sample before the break, with `endS` = that sample's time, so the
 * unobserved time is never counted; sample `i` may then open a new span.
 *
 * Cost: O(n) calls of `predicate`/`exit`. Pure: reads `tS`, never writes it.
 *
 * @param tS sample times, s, ascending (NaN = unknown time)
 * @param predicate true at a sample that starts (or, without `exit`, continues) a span
 * @param opts minimum duration, hysteresis and gap rules
 * @returns spans in time order, each at least `minDurationS` long
 * @throws {RangeError} when `minDurationS` is negative or not a number
 * @example
 * // 10 Hz, value 0 from 0.2 s to 0.7 s (first sample after: 0.7 s)
 * const v = [5, 5, 0, 0, 0, 0, 0, 5];
 * findSpans([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7], (i) => v[i] === 0, { minDurationS: 0.5 });
 * // => [{ startIndex: 2, endIndex: 6, startS: 0.2, endS: 0.7 }]
 */
export function findSpans(tS: ArrayLike<number>, predicate: (i: number) => boolean, opts: FindSpansOptions): Span[] {
  const { minDurationS, exit, breakBefore, maxGapS = Infinity, confirmS = 0 } = opts;
  if (!(minDurationS >= 0)) throw new RangeError(`minDurationS must be ≥ 0, got ${minDurationS}`);
  if (!(confirmS >= 0)) throw new RangeError(`confirmS must be ≥ 0, got ${confirmS}`);
  const leaves = exit ?? ((i: number) => !predicate(i));
  const out: Span[] = [];
  let start = -1; // first sample of the open span, -1 when none
  let last = -1; // last sample inside the open span
  let prev = -1; // previous sample with a finite time
  let runStart = -1; // first sample of the current run where predicate holds, -1 when none
  let confirmed = false;

  const endRun = (t: number) => {
    if (runStart >= 0 && t - tS[runStart] + SPAN_EPSILON_S >= confirmS) confirmed = true;
    runStart = -1;
  };
  const close = (endS: number) => {
    endRun(endS);
    if (confirmed && endS - tS[start] + SPAN_EPSILON_S >= minDurationS) out.push({ startIndex: start, endIndex: last, startS: tS[start], endS });
    start = -1;
  };
  const open = (i: number) => {
    start = last = runStart = i;
    confirmed = confirmS === 0;
  };

  for (let i = 0; i < tS.length; i++) {
    const t = tS[i];
    if (!Number.isFinite(t)) continue;
    const broken = prev >= 0 && ((breakBefore?.(i) ?? false) || t - tS[prev] > maxGapS || t < tS[prev]);
    prev = i;
    if (start >= 0 && broken) close(tS[last]);
    if (start >= 0) {
      if (leaves(i)) close(t);
      else {
        last = i;
        if (confirmS > 0) {
          if (predicate(i)) {
            if (runStart < 0) runStart = i;
          } else endRun(t);
        }
      }
    }
    if (start < 0 && predicate(i)) open(i);
  }
  if (start >= 0) close(tS[last]);
  return out;
}
