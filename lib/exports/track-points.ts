/**
 * The flown track as the exports see it: samples with a position, in seq order, each marked when it
 * starts a new piece. Pure: the exporter feeds stored samples through it in chunks.
 */
import { GAP_FACTOR, hasPosition } from "@/lib/series/levels";

/** One sample with a position; NaN = not logged. */
export interface TrackPoint {
  lat: number;
  lon: number;
  /** Seconds from the run's first sample. */
  tS: number;
  altM: number;
  sats: number;
  hdop: number;
  /** The first point, and every point after a segment start, a reception gap or time going back. */
  newSegment: boolean;
}

export interface SegmentRules {
  /** A step between samples longer than this is a reception gap (s); null = none known. */
  gapS: number | null;
  /** No position for longer than this also breaks the track (s); null = never. */
  positionGapS: number | null;
}

const finite = (v: number) => v - v === 0;

/** Median of the positive steps, NaN for fewer than one. */
function medianStep(t: ArrayLike<number>, keep: (i: number) => boolean): number {
  const steps: number[] = [];
  let last = NaN;
  for (let i = 0; i < t.length; i++) {
    if (!keep(i)) continue;
    const d = t[i] - last;
    if (d > 0) steps.push(d);
    last = t[i];
  }
  if (!steps.length) return NaN;
  steps.sort((a, b) => a - b);
  const m = steps.length >> 1;
  return steps.length % 2 ? steps[m] : (steps[m - 1] + steps[m]) / 2;
}

/**
 * The same thresholds the display levels use (lib/series/levels.ts): GAP_FACTOR × the median step,
 * and for positions GAP_FACTOR × the median step between fixes (never less than the sample gap).
 * `storedGapS` is the stored levels' value when there are levels; the steps come from a leading
 * stretch of the run, which is enough for a median.
 */
export function segmentRules(t: ArrayLike<number>, lat: ArrayLike<number>, lon: ArrayLike<number>, fix: ArrayLike<number>, storedGapS?: number | null): SegmentRules {
  const step = medianStep(t, () => true);
  const gapS = storedGapS !== undefined ? storedGapS : step > 0 ? GAP_FACTOR * step : null;
  const posStep = medianStep(t, (i) => hasPosition(lat[i], lon[i], fix[i]));
  const positionGapS = posStep > 0 ? Math.max(GAP_FACTOR * posStep, gapS ?? 0) : gapS;
  return { gapS, positionGapS };
}

/**
 * Decides, sample by sample in seq order, which positions start a new segment. `breakBefore`
 * carries the levels' own break bit when stored (segment starts from the log included).
 */
export class Segmenter {
  private lastT = NaN;
  private lastPosT = NaN;
  private pending = true;
  constructor(private readonly rules: SegmentRules) {}

  /** Null when the sample has no position; else whether its position starts a segment. */
  next(tS: number, lat: number, lon: number, fix: number, breakBefore = false): boolean | null {
    const { gapS, positionGapS } = this.rules;
    if (breakBefore) this.pending = true;
    if (finite(this.lastT) && (tS < this.lastT || (gapS !== null && tS - this.lastT > gapS))) this.pending = true;
    if (finite(tS)) this.lastT = tS;
    if (!hasPosition(lat, lon, fix) || Math.abs(lat) > 90 || Math.abs(lon) > 180) return null;
    if (positionGapS !== null && finite(this.lastPosT) && tS - this.lastPosT > positionGapS) this.pending = true;
    this.lastPosT = tS;
    const starts = this.pending;
    this.pending = false;
    return starts;
  }
}

/** Points from columnar samples (tests, and the exporter's chunks). */
export function* trackPoints(
  seg: Segmenter,
  s: { t: ArrayLike<number>; lat: ArrayLike<number>; lon: ArrayLike<number>; fixType?: ArrayLike<number>; altM?: ArrayLike<number>; sats?: ArrayLike<number>; hdop?: ArrayLike<number> },
  breakBefore?: (i: number) => boolean,
): Generator<TrackPoint> {
  for (let i = 0; i < s.t.length; i++) {
    const starts = seg.next(s.t[i], s.lat[i], s.lon[i], s.fixType ? s.fixType[i] : NaN, breakBefore?.(i) ?? false);
    if (starts === null) continue;
    yield { lat: s.lat[i], lon: s.lon[i], tS: s.t[i], altM: s.altM ? s.altM[i] : NaN, sats: s.sats ? s.sats[i] : NaN, hdop: s.hdop ? s.hdop[i] : NaN, newSegment: starts };
  }
}

/** Degrees rounded to 7 decimals (about 1 cm), longitude kept in [-180, 180). */
export function roundPosition(lat: number, lon: number): { lat: string; lon: string; latN: number; lonN: number } {
  const latN = Math.round(lat * 1e7) / 1e7;
  let lonN = Math.round(lon * 1e7) / 1e7;
  if (lonN >= 180) lonN -= 360;
  return { lat: decimal(latN, 7), lon: decimal(lonN, 7), latN, lonN };
}

/** A plain decimal (never exponent notation, which xsd:decimal and some readers refuse), trailing zeros dropped. */
export function decimal(v: number, digits: number): string {
  let s = v.toFixed(digits);
  if (s.includes(".")) s = s.replace(/0+$/, "").replace(/\.$/, "");
  return s === "-0" ? "0" : s;
}
