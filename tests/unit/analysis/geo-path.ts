/**
 * Synthetic positions for track and route tests — our own invented data, not from any log.
 * Points are placed with GeographicLib's direct problem (geodesic polar coordinates from an
 * origin), so they do not depend on the plane approximation under test.
 */
import { Geodesic } from "geographiclib-geodesic";

/** An invented field (near Zürich, 47.4° N) where the scenarios are driven. */
export const ORIGIN = { lat: 47.3977, lon: 8.5456 };

/** The position `eastM`, `northM` from `origin`: the geodesic of that length and bearing. */
export function offset(eastM: number, northM: number, origin = ORIGIN): { lat: number; lon: number } {
  const s = Math.hypot(eastM, northM);
  if (s === 0) return { ...origin };
  const azi = (Math.atan2(eastM, northM) * 180) / Math.PI;
  const r = Geodesic.WGS84.Direct(origin.lat, origin.lon, azi, s);
  return { lat: r.lat2!, lon: r.lon2! };
}

/** A path in local metres sampled at `hz`: positions along straight pieces between `points` at `speedMps`. */
export function walk(points: [number, number][], speedMps: number, hz: number): { e: number[]; n: number[] } {
  const e: number[] = [points[0][0]];
  const n: number[] = [points[0][1]];
  const step = speedMps / hz;
  let carry = 0; // distance already walked into the current piece
  for (let p = 1; p < points.length; p++) {
    const [x0, y0] = points[p - 1];
    const [x1, y1] = points[p];
    const len = Math.hypot(x1 - x0, y1 - y0);
    let s = step - carry;
    for (; s <= len + 1e-9; s += step) {
      e.push(x0 + ((x1 - x0) * s) / len);
      n.push(y0 + ((y1 - y0) * s) / len);
    }
    carry = len - (s - step);
  }
  return { e, n };
}

/** Latitude and longitude columns for local metres. */
export function toLatLon(e: number[], n: number[], origin = ORIGIN): { lat: number[]; lon: number[] } {
  const pts = e.map((x, i) => offset(x, n[i], origin));
  return { lat: pts.map((p) => p.lat), lon: pts.map((p) => p.lon) };
}
