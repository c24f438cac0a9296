/**
 * Progress along a route plan: which leg is active at each fix, cross-track and along-track to it,
 * and which waypoints were reached or missed (DESIGN.md §5 "Route").
 */
import { crossTrack, makeLocalProjection, type CrossTrack, type LocalProjection, type XY } from "./geodesy";
import type { AnalysisEvent, RoutePlanInput, RunSeries } from "./types";

/** What following the plan produced. */
export interface WaypointProgress {
  /** Signed cross-track error to the active leg, m (+ right); NaN without a fix or an active leg. */
  xteM: Float64Array;
  /** Along-track distance from the active leg's start, m; NaN likewise. */
  atdM: Float64Array;
  /** Active leg per sample (leg i: waypoint i → i + 1); -1 when none. */
  activeLeg: Int32Array;
  /** Leg lengths in the plane of each leg's start, m. */
  legLengthM: number[];
  /** Names at each leg's ends (the first leg starts at {@link START_NAME} when a start was given). */
  legFrom: string[];
  legTo: string[];
  reached: string[];
  missed: string[];
  /** Index of the first waypoint neither reached nor missed (= waypoint count when all were). */
  next: number;
  /** `waypoint-reached` and `waypoint-missed` events in the order they closed. */
  events: AnalysisEvent[];
}

interface Leg { plane: LocalProjection; b: XY; lengthM: number }

/** Where route following begins: the first leg runs from here to the plan's first waypoint. */
export interface RouteStart {
  /** Sample at which following begins; earlier samples are not followed. */
  index: number;
  lat: number;
  lon: number;
}

/** The name the first leg starts from when it starts at the mission start. */
export const START_NAME = "Start";

/**
 * A mission that starts this close to waypoint 1's circle (m beyond its radius) starts *at* it: a
 * vehicle standing there is at the waypoint give or take GPS scatter (0.5–3 m, DESIGN.md §10), and
 * plans that list home as waypoint 1 would otherwise miss it on the first metre. Our choice.
 */
export const START_AT_WAYPOINT_M = 3;
interface Inside { j: number; first: number; last: number; closestD: number; closestI: number }

const unit = (v: XY): XY => {
  const l = Math.hypot(v[0], v[1]);
  return l > 0 ? [v[0] / l, v[1] / l] : [0, 0];
};

/**
 * Follows the fixes along the plan. With a `start` (the mission start, DESIGN.md §10), following
 * begins at its sample and the first leg runs from its position to waypoint 0, which is reached or
 * missed on that leg like any other (and reached at the start when the start lies within its radius
 * + {@link START_AT_WAYPOINT_M}); without one, the route starts when waypoint 0 is reached or
 * passed. Leg k − 1 is active while waypoint k is the current one (legs counted from the start). Waypoint k is *reached* at the first
 * fix within `radiusM[k]` (the event lasts while the run stays inside; peak = closest approach) and
 * *missed* when the run passes it without entering (peak = closest approach while it was current):
 * - "abeam": along-track on the incoming leg ≥ the leg's length (for waypoint 0: along-track on
 *   leg 0 ≥ 0);
 * - "corner": at a turn, across the corner's bisector (the side where (p − w)·(u_in + u_out) ≥ 0)
 *   and one radius further from the waypoint than its closest approach — a cut corner, which the
 *   abeam rule alone never registers, leaving every later waypoint unjudged.
 * Either advances to the next waypoint on the same fix. Fixes where `skip` is 1 (return-to-home)
 * advance nothing and get no XTE, but still end a reached waypoint's time inside.
 *
 * Cost: O(n · (1 + waypoints the run is inside)). Pure.
 *
 * @param series the run (tS, lat, lon read)
 * @param waypoints the plan's waypoints, degrees
 * @param radiusM acceptance radius per waypoint, m
 * @param usable 1 at a usable fix
 * @param skip 1 at samples where the route is suspended
 * @param distanceFromHome optional per-sample distance from home, m (event positions)
 * @param start optional start of following (sample and position)
 * @returns per-sample XTE/ATD/leg, outcomes and events
 * @example
 * followWaypoints(series, plan.waypoints, [2, 2, 2], usable, new Uint8Array(series.n)).reached; // => ["A", "B", "C"]
 */
export function followWaypoints(
  series: Pick<RunSeries, "n" | "tS" | "lat" | "lon">,
  waypoints: RoutePlanInput["waypoints"],
  radiusM: readonly number[],
  usable: ArrayLike<number>,
  skip: ArrayLike<number>,
  distanceFromHome?: ArrayLike<number>,
  start?: RouteStart,
): WaypointProgress {
  const { n, tS, lat, lon } = series;
  // With a start, it is waypoint 0 of the walk: already passed, and the first leg runs from it.
  const wps = start ? [{ name: START_NAME, lat: start.lat, lon: start.lon }, ...waypoints] : waypoints;
  const radii = start ? [0, ...radiusM] : radiusM;
  const first = start ? 1 : 0; // the first waypoint of the plan
  const m = wps.length;
  const planes = wps.map((w) => makeLocalProjection(w.lat, w.lon));
  const legs: Leg[] = wps.slice(0, -1).map((_, i) => {
    const b = planes[i].toXY(wps[i + 1].lat, wps[i + 1].lon);
    return { plane: planes[i], b, lengthM: Math.hypot(b[0], b[1]) };
  });
  // u_in + u_out at each inner waypoint, in its own plane; null at an end, a hairpin or a zero-length leg.
  const bisector = wps.map((_, k): XY | null => {
    if (k === 0 || k === m - 1) return null;
    const back = unit(planes[k].toXY(wps[k - 1].lat, wps[k - 1].lon)); // = −u_in
    const out = unit(planes[k].toXY(wps[k + 1].lat, wps[k + 1].lon));
    const s: XY = [out[0] - back[0], out[1] - back[1]];
    return Math.hypot(...back) === 0 || Math.hypot(...out) === 0 || Math.hypot(...s) < 1e-6 ? null : s;
  });

  const xteM = new Float64Array(n).fill(NaN);
  const atdM = new Float64Array(n).fill(NaN);
  const activeLeg = new Int32Array(n).fill(-1);
  const reached: string[] = [];
  const missed: string[] = [];
  const events: AnalysisEvent[] = [];
  const dAt = (i: number) => (distanceFromHome && Number.isFinite(distanceFromHome[i]) ? distanceFromHome[i] : null);
  const wpEvent = (kind: "waypoint-reached" | "waypoint-missed", j: number, startS: number, endS: number, ci: number, cd: number, extra: object) =>
    events.push({
      kind, startS, endS, lat: lat[ci], lon: lon[ci], distanceFromHomeM: dAt(ci), peak: cd, threshold: radii[j],
      detail: { durationS: endS - startS, unit: "m", waypoint: wps[j].name, index: j - first, closestS: tS[ci], ...extra },
    });

  let k = first; // current waypoint
  let closestD = Infinity;
  let closestI = -1;
  let inside: Inside[] = [];
  // Cross-track of sample `cur` on leg `ctLeg`, measured once per sample and leg.
  let cur = -1;
  let ctLeg = -1;
  let ct: CrossTrack = { xteM: NaN, atdM: NaN, legLengthM: 0 };
  const on = (L: number) => {
    if (ctLeg !== L) (ct = crossTrack(legs[L].plane.toXY(lat[cur], lon[cur]), [0, 0], legs[L].b)), (ctLeg = L);
    return ct;
  };
  const from = start ? start.index : 0;
  // The start's own distance to the plan's first waypoint (it may lie off the fix at its sample).
  const startToFirst = start ? Math.hypot(...planes[first].toXY(start.lat, start.lon)) : Infinity;
  for (let i = from; i < n; i++) {
    if (usable[i] !== 1) continue;
    const still: Inside[] = [];
    for (const o of inside) {
      const [x, y] = planes[o.j].toXY(lat[i], lon[i]);
      const d = Math.sqrt(x * x + y * y);
      if (d > radii[o.j]) {
        wpEvent("waypoint-reached", o.j, tS[o.first], tS[i], o.closestI, o.closestD, {});
        continue;
      }
      if (d < o.closestD) (o.closestD = d), (o.closestI = i);
      o.last = i;
      still.push(o);
    }
    inside = still;
    if (skip[i] === 1) continue;
    ctLeg = -1;
    cur = i;
    while (k < m) {
      const pk = planes[k].toXY(lat[i], lon[i]);
      const d = Math.sqrt(pk[0] * pk[0] + pk[1] * pk[1]);
      if (d < closestD) (closestD = d), (closestI = i);
      if (d <= radii[k] || (i === from && k === first && startToFirst <= radii[k] + START_AT_WAYPOINT_M)) {
        inside.push({ j: k, first: i, last: i, closestD: d, closestI: i });
        reached.push(wps[k].name);
      } else {
        if (m < 2) break;
        const c = on(k === 0 ? 0 : k - 1);
        const bis = bisector[k];
        const abeam = k === 0 ? c.atdM >= 0 : c.atdM >= c.legLengthM;
        const corner = !abeam && bis !== null && pk[0] * bis[0] + pk[1] * bis[1] >= 0 && d >= closestD + radii[k];
        if (!abeam && !corner) break;
        missed.push(wps[k].name);
        wpEvent("waypoint-missed", k, tS[i], tS[i], closestI, closestD, { how: abeam ? "abeam" : "corner" });
      }
      k++;
      closestD = Infinity;
      closestI = -1;
    }
    if (k >= 1 && k <= m - 1) {
      const c = on(k - 1);
      xteM[i] = c.xteM;
      atdM[i] = c.atdM;
      activeLeg[i] = k - 1;
    }
  }
  for (const o of inside) wpEvent("waypoint-reached", o.j, tS[o.first], tS[o.last], o.closestI, o.closestD, {});
  return { xteM, atdM, activeLeg, legLengthM: legs.map((l) => l.lengthM), legFrom: legs.map((_, L) => wps[L].name), legTo: legs.map((_, L) => wps[L + 1].name), reached, missed, next: k - first, events };
}
