/**
 * Steps between consecutive good fixes and the position jumps among them (DESIGN.md §5 "Track":
 * a jump is a step whose implied speed exceeds a plausible bound).
 */
import { geodesicDistance, makeLocalProjection, type LocalProjection } from "./geodesy";

/** A track moving further than this from its plane's anchor gets a new anchor (plane error ≈ 0.014 % at 60° latitude). */
export const REANCHOR_M = 1000;
/** A track is back from an excursion only when the last good fix is nearer than this share of the jump away. */
export const RETURN_SHARE = 0.5;
/** A jump not followed by a jump back within this time is taken as a lasting offset, not an excursion. */
export const MAX_EXCURSION_S = 10;

/** One position jump. Indices are samples; the event spans from the first implausible fix to the fix that ended it. */
export interface PositionJump {
  /** Last plausible fix before the jump (where the vehicle really was). */
  fromIndex: number;
  /** First fix after the jump. */
  toIndex: number;
  /** The fix that ended it: the first fix back (excursion) or the last jumped-to fix (lasting offset). */
  endIndex: number;
  /** Highest implied speed among the jump's steps, m/s (geodesic distance / time). */
  peakMps: number;
  /** Geodesic length of the first jump, m. */
  jumpM: number;
  /** True when the track came back (the fixes in between are outliers). */
  returned: boolean;
}

/** Per-sample steps and the jumps found. */
export interface TrackSteps {
  /** Distance credited for arriving at sample i from the previous credited fix, m; NaN where none. */
  stepM: Float64Array;
  /** Duration of that step, s; NaN where none. */
  stepS: Float64Array;
  /** 1 at a good fix inside an excursion (out with a jump, back with a jump): not a credible position. */
  outlier: Uint8Array;
  jumps: PositionJump[];
  /** Good fixes skipped because time did not advance from the previous fix. */
  untimedFixes: number;
}

interface Excursion {
  from: number;
  to: number;
  last: number;
  peak: number;
  jumpM: number;
  /** Fast steps inside it, not credited unless it proves a lasting move of an untimed track. */
  fast: { i: number; m: number; s: number }[];
}

/**
 * Walks the good fixes in order and measures each step in a local plane (re-anchored at each
 * segment start and every {@link REANCHOR_M}), never across a segment start or a pause longer
 * than `gapS` (the run-split gap: a recording that resumes days later is not a step). A step whose implied
 * speed exceeds `jumpSpeedMps` is re-measured with a geodesic and, if still too fast, is a jump:
 * its distance is not credited. When a later jump brings the track back to where a plausible
 * speed from the last good fix could reach (within {@link MAX_EXCURSION_S}), the fixes in between
 * are outliers, their steps are dropped, and the straight step from the last good fix to the first
 * fix back is credited instead. Fixes whose time does not advance are skipped.
 *
 * Cost: O(n) plane steps, plus a few geodesics per jump. Pure.
 *
 * @param tS sample times, s
 * @param lat latitude, degrees
 * @param lon longitude, degrees
 * @param segmentStart 1 where a new segment starts
 * @param good 1 at a good fix (e.g. `classifyFixes(...) === FIX_GOOD`)
 * @param jumpSpeedMps implied speed above which a step is a jump, m/s (see jumpBound)
 * @param gapS a step over a longer pause is not a step (s); default: none
 * @param timed false for a track numbered one second per sample: only out-and-back excursions are
 *   jumps, and a fast step that does not come back is a sparse point, credited
 * @returns per-sample steps, outliers and jumps in time order
 * @throws {RangeError} when `jumpSpeedMps` is not a positive number
 * @example
 * // 1 Hz along a meridian, the third fix 200 m off then back: one returned jump
 * trackSteps(t, lat, lon, seg, good, 30).jumps; // => [{ fromIndex: 1, toIndex: 2, endIndex: 3, returned: true, ... }]
 */
export function trackSteps(
  tS: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  good: ArrayLike<number>,
  jumpSpeedMps: number,
  gapS = Infinity,
  timed = true,
): TrackSteps {
  if (!(jumpSpeedMps > 0)) throw new RangeError(`trackSteps needs a positive jumpSpeedMps, got ${jumpSpeedMps}`);
  const n = good.length;
  const stepM = new Float64Array(n).fill(NaN);
  const stepS = new Float64Array(n).fill(NaN);
  const outlier = new Uint8Array(n);
  const jumps: PositionJump[] = [];
  let untimedFixes = 0;
  let prev = -1;
  let proj: LocalProjection | null = null;
  let px = 0;
  let py = 0;
  let exc: Excursion | null = null;

  const closeLasting = () => {
    if (exc && timed) jumps.push({ fromIndex: exc.from, toIndex: exc.to, endIndex: exc.last, peakMps: exc.peak, jumpM: exc.jumpM, returned: false });
    // Without a clock a long step is only a sparse point: the track went there, so it counts.
    else if (exc) for (const f of exc.fast) (stepM[f.i] = f.m), (stepS[f.i] = f.s);
    exc = null;
  };

  for (let i = 0; i < n; i++) {
    if (segmentStart[i] === 1 && i > 0) {
      closeLasting();
      prev = -1;
    }
    if (good[i] !== 1 || !Number.isFinite(tS[i])) continue;
    if (exc && tS[i] - tS[exc.to] > MAX_EXCURSION_S) closeLasting();
    if (prev < 0 || !proj) {
      proj = makeLocalProjection(lat[i], lon[i]);
      px = py = 0;
      prev = i;
      continue;
    }
    const dt = tS[i] - tS[prev];
    if (dt > gapS) {
      // A pause longer than a run gap is a break in the recording, never bridged like a segment start.
      closeLasting();
      proj = makeLocalProjection(lat[i], lon[i]);
      px = py = 0;
      prev = i;
      continue;
    }
    if (!(dt > 0)) {
      untimedFixes++;
      continue;
    }
    const [x, y] = proj.toXY(lat[i], lon[i]);
    let d = Math.sqrt((x - px) * (x - px) + (y - py) * (y - py)); // not Math.hypot: this is the hot loop
    if (d / dt > jumpSpeedMps) d = geodesicDistance(lat[prev], lon[prev], lat[i], lon[i]);
    const v = d / dt;
    if (v <= jumpSpeedMps) {
      stepM[i] = d;
      stepS[i] = dt;
    } else if (!exc) {
      exc = { from: prev, to: i, last: i, peak: v, jumpM: d, fast: [{ i, m: d, s: dt }] };
    } else {
      exc.fast.push({ i, m: d, s: dt });
      exc.peak = Math.max(exc.peak, v);
      exc.last = i;
      const a = exc.from;
      const back = geodesicDistance(lat[a], lon[a], lat[i], lon[i]);
      // Back means back: within reach of the last good fix, and nearer it than half the jump away.
      if (back / (tS[i] - tS[a]) <= jumpSpeedMps && back < RETURN_SHARE * exc.jumpM) {
        for (let j = exc.to; j < i; j++) {
          if (good[j] === 1) outlier[j] = 1;
          stepM[j] = stepS[j] = NaN;
        }
        stepM[i] = back;
        stepS[i] = tS[i] - tS[a];
        jumps.push({ fromIndex: a, toIndex: exc.to, endIndex: i, peakMps: exc.peak, jumpM: exc.jumpM, returned: true });
        exc = null;
      }
    }
    if (x * x + y * y > REANCHOR_M * REANCHOR_M) {
      proj = makeLocalProjection(lat[i], lon[i]);
      px = py = 0;
    } else {
      px = x;
      py = y;
    }
    prev = i;
  }
  closeLasting();
  return { stepM, stepS, outlier, jumps, untimedFixes };
}
