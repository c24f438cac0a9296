/**
 * Where a simulated vehicle is: true positions in metres east/north of a field origin, moved by
 * keyframes (straight, constant-speed pieces), and turned into WGS84 with GeographicLib's direct
 * problem (Karney 2013, J. Geodesy 87:43–55) so no plane approximation enters the logs.
 */
import { Geodesic } from "geographiclib-geodesic";

/** Metres east and north of a field origin. */
export type XY = readonly [number, number];

export interface LatLon {
  lat: number;
  lon: number;
}

/** The practice field of the invented demo crew (Tidewater Robotics), beside its flats. */
export const PRACTICE_FIELD: LatLon = { lat: 53.4698, lon: -3.0542 };

/**
 * The position `xy` metres east/north of `origin`: the geodesic with that length and bearing.
 * @example place(PRACTICE_FIELD, [0, 100]) // ≈ 100 m due north
 */
export function place(origin: LatLon, xy: XY): LatLon {
  const s = Math.hypot(xy[0], xy[1]);
  if (s === 0) return { ...origin };
  const r = Geodesic.WGS84.Direct(origin.lat, origin.lon, (Math.atan2(xy[0], xy[1]) * 180) / Math.PI, s);
  return { lat: r.lat2!, lon: r.lon2! };
}

/** The vehicle is at `at` at time `t`; between keyframes it moves in a straight line at constant speed. */
export interface Keyframe {
  t: number;
  at: XY;
}

/** Position at `t` from time-ordered keyframes (held before the first and after the last). */
export function positionAt(keys: readonly Keyframe[], t: number): XY {
  if (t <= keys[0].t) return keys[0].at;
  for (let k = 1; k < keys.length; k++) {
    const a = keys[k - 1];
    const b = keys[k];
    if (t <= b.t) {
      const f = b.t > a.t ? (t - a.t) / (b.t - a.t) : 1;
      return [a.at[0] + f * (b.at[0] - a.at[0]), a.at[1] + f * (b.at[1] - a.at[1])];
    }
  }
  return keys[keys.length - 1].at;
}

/** Speed at `t`, m/s (0 outside the keyframes and while standing). */
export function speedAt(keys: readonly Keyframe[], t: number): number {
  for (let k = 1; k < keys.length; k++) {
    const a = keys[k - 1];
    const b = keys[k];
    if (t >= a.t && t < b.t) return Math.hypot(b.at[0] - a.at[0], b.at[1] - a.at[1]) / (b.t - a.t);
  }
  return 0;
}

/** Keyframes for driving through `points` at `speedMps`, leaving the first at `t0`. */
export function driveThrough(points: readonly XY[], speedMps: number, t0: number): Keyframe[] {
  const keys: Keyframe[] = [{ t: t0, at: points[0] }];
  for (let k = 1; k < points.length; k++) {
    const d = Math.hypot(points[k][0] - points[k - 1][0], points[k][1] - points[k - 1][1]);
    keys.push({ t: keys[k - 1].t + d / speedMps, at: points[k] });
  }
  return keys;
}

/** The time `keys` reach their last point. */
export const endOf = (keys: readonly Keyframe[]) => keys[keys.length - 1].t;
