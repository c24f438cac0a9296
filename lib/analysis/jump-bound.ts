/**
 * The speed above which a step between fixes is a position jump (DESIGN.md §5 "Track"), set by the
 * vehicle type and by the log's own speeds: a car on a highway logs 33 m/s all day, so a fixed
 * 30 m/s bound would call most of its steps jumps.
 */
import { quantileSorted } from "simple-statistics";

/** A moving step is faster than this (m/s): the median of a parked vehicle's noise says nothing about its pace. */
export const MOVING_MPS = 0.5;
/** The bound is at least this many times the log's median moving step speed (our choice: GPS steps scatter ±50 % around the pace). */
export const STEP_MEDIAN_FACTOR = 3;
/** …and at least this many times the 99th percentile of the logged ground speed (our choice: the receiver's own speed is the best pace evidence). */
export const LOGGED_P99_FACTOR = 1.5;
/** Fewer moving steps than this and the log's pace is not trusted over the vehicle type. */
export const MIN_PACE_STEPS = 20;

/** What set the bound: the vehicle type's default, the log's step speeds, or its logged ground speed. */
export type JumpBoundSource = "vehicle" | "log-steps" | "log-speed";

export interface JumpBound {
  mps: number;
  from: JumpBoundSource;
}

/**
 * The jump bound for one run: the largest of the vehicle type's bound (`vehicleMps`, common
 * practice per type), {@link STEP_MEDIAN_FACTOR} × the median speed of the moving steps between
 * consecutive good fixes, and {@link LOGGED_P99_FACTOR} × the 99th percentile of the logged ground
 * speed. Steps are measured on a local plane with the WGS84 lengths of a degree of latitude and
 * longitude at the step's latitude (the series expansions of the meridian and parallel arcs, as
 * tabulated e.g. in the NGA's "Length of a degree" tables; from memory), well under 0.1 % off over
 * the ≤ km steps that matter; steps across a segment start, across `gapS` or with no time advance are left out.
 *
 * Cost: O(n) plus a sort of the moving steps. Pure.
 *
 * @example
 * // big.gpx, a car trip: median moving step 32.6 m/s → bound ≈ 98 m/s, from "log-steps"
 * jumpBound(tS, lat, lon, seg, good, speed, 30, 1800); // => { mps: 97.8, from: "log-steps" }
 */
export function jumpBound(
  tS: ArrayLike<number>,
  lat: ArrayLike<number>,
  lon: ArrayLike<number>,
  segmentStart: ArrayLike<number>,
  good: ArrayLike<number>,
  speedMps: ArrayLike<number>,
  vehicleMps: number,
  gapS: number,
): JumpBound {
  const n = good.length;
  const steps = new Float64Array(n);
  let k = 0;
  let prev = -1;
  for (let i = 0; i < n; i++) {
    if (segmentStart[i] === 1) prev = -1;
    if (good[i] !== 1 || !Number.isFinite(tS[i])) continue;
    if (prev >= 0) {
      const dt = tS[i] - tS[prev];
      if (dt > 0 && dt <= gapS) {
        const phi = ((lat[i] + lat[prev]) / 2) * (Math.PI / 180);
        const dx = (lon[i] - lon[prev]) * (111_412.84 * Math.cos(phi) - 93.5 * Math.cos(3 * phi));
        const dy = (lat[i] - lat[prev]) * (111_132.954 - 559.822 * Math.cos(2 * phi) + 1.175 * Math.cos(4 * phi));
        const v = Math.sqrt(dx * dx + dy * dy) / dt;
        if (v > MOVING_MPS) steps[k++] = v;
      }
    }
    prev = i;
  }
  let best: JumpBound = { mps: vehicleMps, from: "vehicle" };
  if (k >= MIN_PACE_STEPS) {
    const sorted = steps.subarray(0, k).sort();
    const v = STEP_MEDIAN_FACTOR * quantileSorted(sorted as unknown as number[], 0.5);
    if (v > best.mps) best = { mps: v, from: "log-steps" };
  }
  let m = 0;
  const logged = new Float64Array(speedMps.length);
  for (let i = 0; i < speedMps.length; i++) if (speedMps[i] >= 0 && Number.isFinite(speedMps[i])) logged[m++] = speedMps[i];
  if (m >= MIN_PACE_STEPS) {
    const sorted = logged.subarray(0, m).sort();
    const v = LOGGED_P99_FACTOR * quantileSorted(sorted as unknown as number[], 0.99);
    if (v > best.mps) best = { mps: v, from: "log-speed" };
  }
  return best;
}
