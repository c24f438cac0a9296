/**
 * GPS fix quality per sample (DESIGN.md §5 "Track"): which samples carry a usable position, and
 * the spans where the fix was lost after it had been acquired.
 */
import { findSpans, type Span } from "./spans";
import type { RunSeries } from "./types";

/** No position in this row and nothing saying the fix was lost (e.g. a link-only row of a mixed-rate log). */
export const FIX_MISSING = 0;
/** A usable fix. */
export const FIX_GOOD = 1;
/** A row that reports no fix: position 0,0 or out of range, fix type 0, or too few satellites. */
export const FIX_BAD = 2;

/**
 * Classifies every sample's fix. A fix is good when lat/lon are finite and in range, not 0,0,
 * the fix type is not 0 (when logged) and satellites ≥ `minSats` (when logged). A row without a
 * position is FIX_BAD when its fix type or satellite count says the fix was lost, else FIX_MISSING.
 *
 * Cost: O(n). Pure.
 *
 * @param series the run (lat, lon, fixType, sats read)
 * @param minSats fewest satellites for a usable fix
 * @returns one of FIX_MISSING / FIX_GOOD / FIX_BAD per sample
 * @example
 * classifyFixes({ n: 3, lat: [NaN, 0, 47.4], lon: [NaN, 0, 8.5], fixType: [NaN, NaN, 3], sats: [NaN, NaN, 9] }, 5);
 * // => Uint8Array [0, 2, 1]
 */
export function classifyFixes(series: Pick<RunSeries, "n" | "lat" | "lon" | "fixType" | "sats">, minSats: number): Uint8Array {
  const { n, lat, lon, fixType, sats } = series;
  const out = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const la = lat[i];
    const lo = lon[i];
    const noFixType = fixType[i] === 0; // NaN (not logged) compares false
    const fewSats = sats[i] < minSats; // likewise
    if (!Number.isFinite(la) || !Number.isFinite(lo)) {
      out[i] = noFixType || fewSats ? FIX_BAD : FIX_MISSING;
    } else {
      const zero = la === 0 && lo === 0;
      const outOfRange = Math.abs(la) > 90 || Math.abs(lo) > 180;
      out[i] = zero || outOfRange || noFixType || fewSats ? FIX_BAD : FIX_GOOD;
    }
  }
  return out;
}

/** Why a fix counted as lost. */
export type FixLostCause = "no-position" | "zero-position" | "fix-type-0" | "few-satellites";

/** A fix-lost span and why the fix counted as lost. */
export interface FixLostSpan extends Span {
  /** Last good fix before the span (its position is the event's position), or -1. */
  lastGoodIndex: number;
  causes: FixLostCause[];
  /** Fewest satellites logged inside the span, or null. */
  minSats: number | null;
}

/** Median time between consecutive good fixes, s (0 with fewer than two). */
function typicalFixIntervalS(tS: ArrayLike<number>, classes: Uint8Array): number {
  const steps = new Float64Array(classes.length);
  let count = 0;
  let prev = -1;
  for (let i = 0; i < classes.length; i++) {
    if (classes[i] !== FIX_GOOD || !Number.isFinite(tS[i])) continue;
    if (prev >= 0 && tS[i] > tS[prev]) steps[count++] = tS[i] - tS[prev];
    prev = i;
  }
  const used = steps.subarray(0, count).sort(); // typed-array sort is numeric
  return count ? used[count >> 1] : 0;
}

/** Rows without a position count as a lost fix when the good fixes around them are this many typical intervals apart. */
export const MISSING_GAP_FACTOR = 1.5;

/**
 * Spans after `fromIndex` (the first good fix, home) with no good fix, split at segment starts.
 * A span holding a FIX_BAD row always counts. A span of FIX_MISSING rows only counts when the last
 * good fix before it (in the same segment) and the sample that ends it are at least
 * {@link MISSING_GAP_FACTOR} × the typical fix interval apart, so a log that writes GPS at 5 Hz
 * between 50 Hz link rows does not "lose" its fix between GPS rows. Span times follow
 * {@link findSpans}: `endS` is the time of the good fix that ends the span.
 *
 * Cost: O(n log n) (the median interval). Pure.
 *
 * @param series the run (tS, lat, lon, fixType, sats, segmentStart read)
 * @param classes from {@link classifyFixes}
 * @param fromIndex first good fix (home); earlier samples never start a span; -1 → no spans
 * @param minSats fewest satellites for a usable fix (to name the cause)
 * @returns spans in time order
 * @example
 * // 1 Hz, fix lost at 2 s and back at 4 s
 * fixLostSpans(series, Uint8Array.of(1, 1, 2, 2, 1), 0, 5); // => [{ startS: 2, endS: 4, lastGoodIndex: 1, ... }]
 */
export function fixLostSpans(
  series: Pick<RunSeries, "tS" | "lat" | "lon" | "fixType" | "sats" | "segmentStart">,
  classes: Uint8Array,
  fromIndex: number,
  minSats: number,
): FixLostSpan[] {
  if (fromIndex < 0) return [];
  const { tS, lat, lon, fixType, sats, segmentStart } = series;
  const spans = findSpans(tS, (i) => i > fromIndex && classes[i] !== FIX_GOOD, {
    minDurationS: 0,
    breakBefore: (i) => segmentStart[i] === 1,
  });
  const typical = typicalFixIntervalS(tS, classes);
  const out: FixLostSpan[] = [];
  let good = -1; // last good fix before the span, any segment: the event's position
  let ref = NaN; // its time, when it lies in the span's own segment
  let k = 0;
  for (const span of spans) {
    for (; k <= span.startIndex; k++) {
      if (segmentStart[k] === 1) ref = NaN;
      if (k < span.startIndex && classes[k] === FIX_GOOD) {
        good = k;
        ref = tS[k];
      }
    }
    const causes = new Set<FixLostCause>();
    let fewest = Infinity;
    let explicit = false;
    for (let i = span.startIndex; i <= span.endIndex; i++) {
      if (classes[i] === FIX_BAD) explicit = true;
      if (!Number.isFinite(lat[i]) || !Number.isFinite(lon[i])) causes.add("no-position");
      else if (lat[i] === 0 && lon[i] === 0) causes.add("zero-position");
      if (fixType[i] === 0) causes.add("fix-type-0");
      if (sats[i] < minSats) causes.add("few-satellites");
      if (sats[i] < fewest) fewest = sats[i];
    }
    const gapS = span.endS - (Number.isNaN(ref) ? span.startS : ref);
    if (explicit || gapS + 1e-9 >= MISSING_GAP_FACTOR * typical) {
      out.push({ ...span, lastGoodIndex: good, causes: [...causes], minSats: fewest === Infinity ? null : fewest });
    }
  }
  return out;
}
