/**
 * The geometry the scenario expectations are computed with: GeographicLib's geodesics on WGS84
 * (Karney 2013, "Algorithms for geodesics", J. Geodesy 87:43–55), independent of the analysis' own
 * local-plane code.
 */
import { Geodesic } from "geographiclib-geodesic";

export interface LatLon {
  lat: number;
  lon: number;
}

/** Geodesic distance on WGS84, m. */
export function geodesicM(a: LatLon, b: LatLon): number {
  return Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon).s12!;
}

/**
 * Signed distance of `p` from the geodesic a → b, m (+ right of it), from the inverse problem
 * a → p: s·sin(azimuth(a → p) − azimuth(a → b)). Over the ≤ 200 m legs here this differs from the
 * true cross-track distance by far less than a millimetre.
 */
export function crossTrackM(a: LatLon, b: LatLon, p: LatLon): number {
  const ab = Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon).azi1!;
  const ap = Geodesic.WGS84.Inverse(a.lat, a.lon, p.lat, p.lon);
  return ap.s12! * Math.sin(((ap.azi1! - ab) * Math.PI) / 180);
}
