/**
 * Route following (DESIGN.md §5 "Route"): cross-track and along-track per sample, waypoints
 * reached or missed, off-route spans, per-leg statistics, and return-to-home straightness.
 */
import { quantileSorted } from "simple-statistics";
import { classifyFixes, FIX_GOOD } from "./gps-fix";
import { rthDeviation, type RthDeviation } from "./rth-deviation";
import { spanEvent } from "./span-event";
import { findSpans } from "./spans";
import type { AnalysisEvent, RoutePlanInput, RunSeries, Thresholds } from "./types";
import { followWaypoints, type RouteStart } from "./waypoint-progress";

/** Outputs of earlier steps that `analyseRoute` uses; all optional. */
export interface RouteOptions {
  /** Per-sample distance from home, m (TrackResult.distanceFromHomeM), for event positions. */
  distanceFromHome?: Float64Array;
  /** Return-to-home spans, s: route following is suspended inside them. */
  rthSpans?: { startS: number; endS: number }[];
  /** Per-sample usable-fix mask (TrackResult.usableFix); default: good fixes, without removing jump outliers. */
  usableFix?: ArrayLike<number>;
  /** Home (TrackResult.home); default: the first usable fix. */
  home?: { lat: number; lon: number } | null;
  /** Mission start (findMissionStart): following begins there and the first leg runs from it to waypoint 1. */
  start?: RouteStart;
  /** Per sample: 1 where following is suspended besides return-to-home (land mode, mission not engaged). */
  suspended?: ArrayLike<number>;
}

/** Cross-track statistics of one leg (waypoint i → i + 1) over the samples it was active; m. */
export interface LegStats {
  index: number;
  from: string;
  to: string;
  lengthM: number;
  samples: number;
  rmsXteM: number | null;
  /** 95th percentile of |XTE|, linear interpolation (R type 7, simple-statistics `quantileSorted`). */
  p95XteM: number | null;
  maxXteM: number | null;
}

/** What `analyseRoute` finds; distances m, times s. */
export interface RouteResult {
  /** Signed cross-track error to the active leg, m (+ right); NaN without a fix or an active leg. */
  xteM: Float64Array;
  /** Along-track distance from the active leg's start, m; NaN likewise. */
  atdM: Float64Array;
  /** Active leg per sample; -1 before the route starts, after it ends, in return-to-home, or without a fix. */
  activeLeg: Int32Array;
  /** Deviation from the straight line home during return-to-home, m; NaN elsewhere. */
  rthDeviationM: Float64Array;
  legs: LegStats[];
  /** Waypoint names in the order they were reached / missed; the rest were never reached nor passed. */
  reached: string[];
  missed: string[];
  notReached: string[];
  rth: RthDeviation[];
  /** `waypoint-reached`, `waypoint-missed` and `off-route` events in time order. */
  events: AnalysisEvent[];
}

/**
 * Analyses a run against its route plan. With `opts.start` the first leg runs from the mission
 * start to waypoint 1, then leg i from waypoint i to i + 1; the active leg, XTE, ATD and waypoint
 * outcomes follow `followWaypoints`: a waypoint is *reached* at the first fix within
 * `radiusM ?? th.acceptanceRadiusM` and *missed* when passed abeam (or its corner cut) without
 * entering. XTE/ATD are measured in a plane anchored at each leg's start.
 * `off-route`: |XTE| > `plan.corridorM ?? th.corridorM` for ≥ `th.offRouteMinS` without a break,
 * ending only when |XTE| falls below corridor − `th.offRouteExitMarginM` (hysteresis, so noise at
 * the edge gives one event, DESIGN.md §10); a fix gap longer than `offRouteMinS` (at least 1 s) or
 * a segment start ends it; peak = max |XTE|, position at its start.
 * Inside `opts.rthSpans` the route is suspended and the deviation from the straight line home is
 * measured instead (see `rthDeviation`); inside `opts.suspended` (landing, mission switched off)
 * it is suspended too.
 *
 * Cost: O(n · (1 + open waypoints)) plus O(s log s) per leg for the percentile. Pure.
 *
 * @param series the run
 * @param plan waypoints (degrees, radius m) and corridor half-width (m)
 * @param th thresholds (acceptanceRadiusM, corridorM, offRouteMinS, minSats read)
 * @param opts track outputs and return-to-home spans
 * @returns per-sample XTE/ATD/leg, per-leg stats, waypoint outcomes, RTH deviation and events
 * @throws {RangeError} for a waypoint off the globe or at a pole, a radius or corridor ≤ 0, or a
 *   `distanceFromHome` whose length is not `series.n`
 * @example
 * const r = analyseRoute(series, { waypoints: [{ name: "A", lat: 47.4, lon: 8.5 }, { name: "B", lat: 47.401, lon: 8.5 }] }, th, {});
 * r.reached; // => ["A", "B"]
 */
export function analyseRoute(series: RunSeries, plan: RoutePlanInput, th: Thresholds, opts: RouteOptions = {}): RouteResult {
  const { n, tS, lat, lon, segmentStart } = series;
  const wps = plan.waypoints;
  const corridor = plan.corridorM ?? th.corridorM;
  if (!(corridor > 0)) throw new RangeError(`analyseRoute needs a corridor > 0 m, got ${corridor}`);
  if (opts.distanceFromHome && opts.distanceFromHome.length !== n) throw new RangeError("analyseRoute: distanceFromHome must have series.n values");
  const radius = wps.map((w) => w.radiusM ?? th.acceptanceRadiusM);
  wps.forEach((w, j) => {
    if (!(Math.abs(w.lat) < 90) || !(Math.abs(w.lon) <= 180)) throw new RangeError(`analyseRoute: waypoint "${w.name}" is not a position (${w.lat}, ${w.lon})`);
    if (!(radius[j] > 0)) throw new RangeError(`analyseRoute: waypoint "${w.name}" needs a radius > 0 m, got ${radius[j]}`);
  });
  const usable = opts.usableFix ?? Uint8Array.from(classifyFixes(series, th.minSats), (c) => (c === FIX_GOOD ? 1 : 0));
  const inRth = new Uint8Array(n); // 1 where following is suspended: return-to-home, or opts.suspended
  // One pass over the samples with a pointer into the time-ordered spans: O(n + spans).
  const spansSorted = [...(opts.rthSpans ?? [])].sort((a, b) => a.startS - b.startS);
  for (let i = 0, k = 0; i < n && spansSorted.length; i++) {
    while (k < spansSorted.length && spansSorted[k].endS < tS[i]) k++;
    for (let j = k; j < spansSorted.length && spansSorted[j].startS <= tS[i]; j++) {
      if (tS[i] <= spansSorted[j].endS) {
        inRth[i] = 1;
        break;
      }
    }
  }
  if (opts.suspended) for (let i = 0; i < n; i++) if (opts.suspended[i] === 1) inRth[i] = 1;
  const dist = opts.distanceFromHome;
  const { xteM, atdM, activeLeg, legLengthM, legFrom, legTo, reached, missed, next, events } = followWaypoints(series, wps, radius, usable, inRth, dist, opts.start);

  // Off-route: spans over usable fixes and RTH samples (which end a span); segment starts on skipped rows still break.
  const tRoute = new Float64Array(n).fill(NaN);
  const brk = new Uint8Array(n);
  let pending = false;
  for (let i = 0; i < n; i++) {
    if (segmentStart[i] === 1) pending = true;
    if (usable[i] !== 1 && !inRth[i]) continue;
    tRoute[i] = tS[i];
    if (pending) (brk[i] = 1), (pending = false);
  }
  const exitBelow = corridor - th.offRouteExitMarginM;
  const offSpans = findSpans(tRoute, (i) => Math.abs(xteM[i]) > corridor, {
    minDurationS: th.offRouteMinS,
    confirmS: th.offRouteMinS,
    // NaN (suspended, no leg) ends it too: only a measured return inside the margin or a pause ends an excursion.
    exit: (i) => !(Math.abs(xteM[i]) >= exitBelow),
    breakBefore: (i) => brk[i] === 1,
    maxGapS: Math.max(th.offRouteMinS, 1), // an unobserved stretch that long is not claimed as off-route
  });
  for (const s of offSpans) {
    let pi = s.startIndex;
    for (let i = s.startIndex; i <= s.endIndex; i++) if (Math.abs(xteM[i]) > Math.abs(xteM[pi])) pi = i;
    const L = activeLeg[pi];
    events.push(spanEvent("off-route", s, series, {
      peak: Math.abs(xteM[pi]), threshold: corridor, distanceFromHome: dist,
      detail: { unit: "m", legIndex: L, from: legFrom[L], to: legTo[L], side: xteM[pi] > 0 ? "right" : "left", peakS: tS[pi], exitBelowM: exitBelow },
    }));
  }
  events.sort((a, b) => a.startS - b.startS);

  // |XTE| per leg, bucketed into one buffer (a counting sort by leg) so each leg sorts a typed subarray.
  const count = new Int32Array(legLengthM.length + 1);
  for (let i = 0; i < n; i++) if (activeLeg[i] >= 0 && Number.isFinite(xteM[i])) count[activeLeg[i] + 1]++;
  for (let L = 1; L < count.length; L++) count[L] += count[L - 1];
  const abs = new Float64Array(count[count.length - 1]);
  const fill = count.slice(0, -1);
  for (let i = 0; i < n; i++) if (activeLeg[i] >= 0 && Number.isFinite(xteM[i])) abs[fill[activeLeg[i]]++] = Math.abs(xteM[i]);
  const legStats: LegStats[] = legLengthM.map((lengthM, L) => {
    const v = abs.subarray(count[L], count[L + 1]).sort(); // numeric for typed arrays
    let sq = 0;
    for (const x of v) sq += x * x;
    const has = v.length > 0;
    return {
      index: L, from: legFrom[L], to: legTo[L], lengthM, samples: v.length,
      rmsXteM: has ? Math.sqrt(sq / v.length) : null,
      p95XteM: has ? quantileSorted(v as unknown as number[], 0.95) : null, // its .d.ts says number[]; it only indexes
      maxXteM: has ? v[v.length - 1] : null,
    };
  });

  let home = opts.home ?? null;
  if (opts.home === undefined) for (let i = 0; i < n && !home; i++) if (usable[i] === 1) home = { lat: lat[i], lon: lon[i] };
  const rth = rthDeviation(series, usable, home, opts.rthSpans ?? []);

  return {
    xteM, atdM, activeLeg, rthDeviationM: rth.deviationM, legs: legStats,
    reached, missed, notReached: wps.slice(next).map((w) => w.name), rth: rth.spans, events,
  };
}
