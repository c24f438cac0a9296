/**
 * Geodesy for the track and route analysis. Distances and azimuths on the WGS84 ellipsoid come
 * from GeographicLib (Karney 2013, "Algorithms for geodesics", J. Geodesy 87:43–55) — there is
 * no hand-written haversine in the product. For the many short steps of a run, a local tangent
 * plane stands in for the ellipsoid: one geodesic inverse costs ≈ 2 µs, a plane step tens of nanoseconds.
 */
import { Constants, Geodesic } from "geographiclib-geodesic";

/** A GeographicLib ellipsoid model (`Geodesic.WGS84`, or `new Geodesic.Geodesic(a, f)`). */
export type GeodesicModel = typeof Geodesic.WGS84;

/** A point in a local plane: metres east and north of the plane's anchor. */
export type XY = readonly [eastM: number, northM: number];

/** Result of the inverse geodesic problem. Azimuths are clockwise from north, degrees in (−180, 180]. */
export interface GeodesicInverse {
  distanceM: number;
  /** Forward azimuth at point 1, deg. */
  azimuth1Deg: number;
  /** Forward azimuth at point 2 (the direction of travel on arrival), deg. */
  azimuth2Deg: number;
}

const DEG = Math.PI / 180;

/**
 * Length of the shortest path (geodesic) between two points on the ellipsoid, by GeographicLib.
 * Accurate to about 15 nanometres for any pair of points, nearly antipodal ones included (Karney 2013).
 *
 * Cost: one geodesic inverse, ≈ 2 µs. Pure.
 *
 * @param lat1 latitude of point 1, degrees (−90…90)
 * @param lon1 longitude of point 1, degrees
 * @param lat2 latitude of point 2, degrees
 * @param lon2 longitude of point 2, degrees
 * @param model ellipsoid; WGS84 unless given
 * @returns distance in metres; NaN when any input is NaN
 * @example
 * geodesicDistance(-41.32, 174.81, 40.96, -5.5); // => 19959679.267 (Wellington → Salamanca, GeographicLib docs)
 */
export function geodesicDistance(lat1: number, lon1: number, lat2: number, lon2: number, model: GeodesicModel = Geodesic.WGS84): number {
  const r = model.Inverse(lat1, lon1, lat2, lon2, Geodesic.DISTANCE);
  return r.s12 ?? NaN;
}

/**
 * Distance and azimuths of the geodesic between two points (the inverse problem), by GeographicLib.
 *
 * Cost: one geodesic inverse, ≈ 2 µs. Pure.
 *
 * @param lat1 latitude of point 1, degrees
 * @param lon1 longitude of point 1, degrees
 * @param lat2 latitude of point 2, degrees
 * @param lon2 longitude of point 2, degrees
 * @param model ellipsoid; WGS84 unless given
 * @returns distance (m) and forward azimuths at both ends (deg); NaN fields when any input is NaN
 * @example
 * geodesicInverse(-30, 0, 29.9, 179.8);
 * // => { distanceM: 19989832.8276, azimuth1Deg: 161.8905247, azimuth2Deg: 18.0907372 } (Karney 2013)
 */
export function geodesicInverse(lat1: number, lon1: number, lat2: number, lon2: number, model: GeodesicModel = Geodesic.WGS84): GeodesicInverse {
  const r = model.Inverse(lat1, lon1, lat2, lon2, Geodesic.DISTANCE | Geodesic.AZIMUTH);
  return { distanceM: r.s12 ?? NaN, azimuth1Deg: r.azi1 ?? NaN, azimuth2Deg: r.azi2 ?? NaN };
}

/** A local tangent plane anchored at one point. */
export interface LocalProjection {
  readonly lat0: number;
  readonly lon0: number;
  /** Metres east and north of the anchor. Longitudes are unwrapped across ±180°. */
  toXY(lat: number, lon: number): [eastM: number, northM: number];
}

/**
 * A local tangent-plane (equirectangular) projection at (lat0, lon0), scaled by the WGS84 radii
 * of curvature at lat0, with e² = f(2 − f) and W = √(1 − e² sin² φ0):
 *
 *   N = a / W                (prime vertical)      east  = N · cos φ0 · Δλ
 *   M = a (1 − e²) / W³      (meridian)            north = M · Δφ        (Δλ, Δφ in radians)
 *
 * The radii are the standard ones (e.g. Torge & Müller, "Geodesy", 4th ed. 2012, ch. 4 — quoted
 * from memory, section not checked); a and f are WGS84 (NIMA TR8350.2, 3rd ed. 2000), taken from
 * GeographicLib's constants. Distances in the plane agree with geodesics to a relative error of
 * about tan φ0 · Δφ / 2 (≈ 3·10⁻⁴ at 2 km from the anchor at 60° latitude) plus a second-order term,
 * so callers re-anchor per leg or segment, or when a track moves far from the anchor. A straight
 * line in the plane departs from the geodesic by about L² tan φ / (8R) on an east–west leg of
 * length L (2 cm for 1 km at 45°).
 *
 * Cost: O(1) to make, a few multiplications per point. Pure.
 *
 * @param lat0 anchor latitude, degrees (strictly between −90 and 90)
 * @param lon0 anchor longitude, degrees
 * @returns the projection
 * @throws {RangeError} when the anchor is not finite or lies at a pole
 * @example
 * makeLocalProjection(45, 7).toXY(45.001, 7.001); // => [78.8, 111.1] (m east, m north; approx.)
 */
export function makeLocalProjection(lat0: number, lon0: number): LocalProjection {
  if (!Number.isFinite(lat0) || !Number.isFinite(lon0) || Math.abs(lat0) >= 90) {
    throw new RangeError(`makeLocalProjection needs a finite anchor off the poles, got ${lat0}, ${lon0}`);
  }
  const { a, f } = Constants.WGS84;
  const e2 = f * (2 - f);
  const s = Math.sin(lat0 * DEG);
  const w = Math.sqrt(1 - e2 * s * s);
  const kEast = (a / w) * Math.cos(lat0 * DEG) * DEG; // metres per degree of longitude
  const kNorth = ((a * (1 - e2)) / (w * w * w)) * DEG; // metres per degree of latitude
  return {
    lat0,
    lon0,
    toXY(lat: number, lon: number): [number, number] {
      let dLon = lon - lon0;
      if (dLon > 180) dLon -= 360;
      else if (dLon < -180) dLon += 360;
      return [dLon * kEast, (lat - lat0) * kNorth];
    },
  };
}

/** Where a point lies relative to a track a → b, in the plane. */
export interface CrossTrack {
  /** Signed cross-track distance, m: positive right of the track a → b, negative left. NaN when a = b. */
  xteM: number;
  /** Along-track distance from a to the foot of the perpendicular, m (negative behind a). 0 when a = b. */
  atdM: number;
  /** |b − a|, m. */
  legLengthM: number;
}

/**
 * Signed cross-track and along-track distance of a point from the straight track a → b in a
 * local plane (see {@link makeLocalProjection}); "right" is right of the direction of travel,
 * as in the Aviation Formulary (Ed Williams), whose spherical formulas this matches for short legs.
 *
 * With d = b − a, r = p − a and L = |d|: xte = (d_y·r_x − d_x·r_y) / L, atd = (d·r) / L.
 *
 * Cost: O(1). Pure.
 *
 * @param p the point, m east/north
 * @param a track start, m east/north
 * @param b track end, m east/north
 * @returns cross-track (m, + right), along-track (m) and leg length (m)
 * @example
 * crossTrack([3, 5], [0, 0], [0, 10]); // => { xteM: 3, atdM: 5, legLengthM: 10 } (3 m right of a northbound leg)
 */
export function crossTrack(p: XY, a: XY, b: XY): CrossTrack {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const rx = p[0] - a[0];
  const ry = p[1] - a[1];
  const len = Math.hypot(dx, dy);
  if (len === 0) return { xteM: NaN, atdM: 0, legLengthM: 0 };
  return { xteM: (dy * rx - dx * ry) / len, atdM: (dx * rx + dy * ry) / len, legLengthM: len };
}
