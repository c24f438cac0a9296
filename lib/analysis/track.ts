/**
 * The track (DESIGN.md §5 "Track"): home, distance travelled, distance from home, speed, GPS
 * quality, and the `fix-lost` and `position-jump` events.
 */
import type { HomeSource } from "./evidence";
import { geodesicDistance, makeLocalProjection } from "./geodesy";
import { classifyFixes, FIX_BAD, FIX_GOOD, fixLostSpans } from "./gps-fix";
import { placeHome } from "./home";
import { jumpBound, type JumpBound } from "./jump-bound";
import { trackSteps } from "./position-jumps";
import type { AnalysisEvent, RunSeries, Thresholds } from "./types";

/** Within this distance of home the per-sample distance comes from a plane at home (≈ 0.03 % off at 60° latitude); beyond, from a geodesic. */
export const NEAR_HOME_M = 2000;
/** Speeds from steps are taken over windows of at least this length, s, so GPS noise at 10 Hz does not read as speed. */
export const SPEED_WINDOW_S = 1;

/** Fixes before a long pause at the start of a run are a stale position when they are at most this share of the fixes… */
export const STALE_MAX_SHARE = 0.05;
/** …and the run resumes at least this far from them (m): a receiver reporting where its last session ended. */
export const STALE_MIN_M = 1000;

/** Options of analyseTrack. */
export interface TrackOptions {
  /** False when the log's times cannot pace it (the parser said "no-times"): no time figures. Default true. */
  timesUsable?: boolean;
}

/** A sample's place on the run. */
export interface TrackPoint {
  index: number;
  tS: number;
  lat: number;
  lon: number;
}
/** What `analyseTrack` finds; distances m, speeds m/s, times s. */
export interface TrackResult {
  /** Where home was placed (see placeHome), or null when the log has no usable fix. */
  home: TrackPoint | null;
  /** Which rule placed home. */
  homeSource: HomeSource | null;
  /** First armed sample, -1 when the log never shows the vehicle armed. */
  armedIndex: number;
  /** Sum of credited steps between consecutive good fixes from home on, m (none across a segment start, a long pause or a jump). */
  distanceM: number;
  /** Time of the credited steps, s (the time spent moving between fixes, pauses and gaps left out). */
  movingS: number;
  /** First sample of the run proper: fixes before it are a stale position (see staleLead); 0 when none. */
  firstIndex: number;
  /** Good fixes set aside as a stale position before the run. */
  staleFixes: number;
  /** The jump bound used and what set it. */
  jumpBound: JumpBound;
  /** Largest geodesic distance from home, m; null without a fix. */
  maxDistanceFromHomeM: number | null;
  farthest: TrackPoint | null;
  maxSpeedMps: number | null;
  meanSpeedMps: number | null;
  /** "log" when the log carries ground speed, "steps" when speed comes from positions. */
  speedSource: "log" | "steps" | null;
  /** Time with HDOP above `th.hdopWarn` from home on, s (each value held until the next; not across gaps or lost fixes). */
  hdopWarnS: number;
  maxHdop: number | null;
  /** Total time inside fix-lost events, s. */
  fixLostS: number;
  /** Samples with a usable fix. */
  usableFixes: number;
  /** Per sample: distance from home, m; NaN where there is no usable fix. For the link, range and route steps. */
  distanceFromHomeM: Float64Array;
  /** Per sample: 1 at a usable fix (good, and not an outlier of a position jump). */
  usableFix: Uint8Array;
  /** `fix-lost` and `position-jump` events in time order. */
  events: AnalysisEvent[];
}

const point = (series: RunSeries, i: number): TrackPoint => ({ index: i, tS: series.tS[i], lat: series.lat[i], lon: series.lon[i] });
const orNull = (v: number) => (Number.isFinite(v) ? v : null);

/**
 * Analyses the track of a run. A good fix has finite lat/lon (not 0,0), fix type ≠ 0 and at least
 * `th.minSats` satellites when those are logged; home follows {@link placeHome} (the first good fix
 * at or after arming, DESIGN.md §10). Everything measured "on the run" starts at home: distance
 * travelled, distance from home (NaN before it), speeds, HDOP time and lost fixes — the walk from
 * the car and a cold start's poor fixes are not the run. Steps are measured in a local plane (see
 * `trackSteps`), distance from home in a plane at home within {@link NEAR_HOME_M} and by geodesic
 * beyond; the maximum is always a geodesic. Max and mean speed come from the logged ground speed
 * when present, else from credited steps (max over ≥ {@link SPEED_WINDOW_S} windows; mean =
 * distance / time of credited steps). `fix-lost` spans follow `fixLostSpans`; `position-jump`
 * events follow `trackSteps` (peak = implied speed, m/s).
 *
 * Cost: O(n) plus O(n log n) for the typical fix interval; one geodesic per sample only beyond
 * {@link NEAR_HOME_M}. Pure: reads `series`, returns new arrays.
 *
 * @param series the run
 * @param th thresholds (minSats, homeMinSats, homeMaxHdop, hdopWarn, jumpSpeedMps read)
 * @returns the track summary, per-sample distance from home and usable-fix mask, and events
 * @throws {RangeError} when `th.jumpSpeedMps` is not positive
 * @example
 * const t = analyseTrack(series, defaultThresholds("ground"));
 * t.distanceM; // => 1234.5 (m)
 * t.events.filter((e) => e.kind === "fix-lost").length; // => 1
 */
export function analyseTrack(series: RunSeries, th: Thresholds, opts: TrackOptions = {}): TrackResult {
  const { n, tS, lat, lon, hdop, speedMps, segmentStart } = series;
  const timed = opts.timesUsable ?? true;
  const classes = classifyFixes(series, th.minSats);
  const good = new Uint8Array(n);
  for (let i = 0; i < n; i++) good[i] = classes[i] === FIX_GOOD ? 1 : 0;
  const firstIndex = timed ? staleLead(tS, lat, lon, good, th.runSplitGapS) : 0;
  let staleFixes = 0;
  for (let i = 0; i < firstIndex; i++) if (good[i]) (staleFixes++, (good[i] = 0));
  // Untimed samples are numbered one second apart: the bound then reads in metres per sample.
  const bound = jumpBound(tS, lat, lon, segmentStart, good, speedMps, th.jumpSpeedMps, th.runSplitGapS);
  const steps = trackSteps(tS, lat, lon, segmentStart, good, bound.mps, timed ? th.runSplitGapS : Infinity, timed);

  const usableFix = new Uint8Array(n);
  const distanceFromHomeM = new Float64Array(n).fill(NaN);
  let homeIndex = -1;
  let usableFixes = 0;
  let far = -1;
  for (let i = 0; i < n; i++) usableFix[i] = good[i] && !steps.outlier[i] ? 1 : 0;
  const placed = placeHome(series, usableFix, th);
  homeIndex = placed.index;
  if (homeIndex >= 0) {
    const h = point(series, homeIndex);
    const plane = makeLocalProjection(h.lat, h.lon);
    for (let i = homeIndex; i < n; i++) {
      if (!usableFix[i]) continue;
      usableFixes++;
      const [x, y] = plane.toXY(lat[i], lon[i]);
      let d = Math.sqrt(x * x + y * y);
      if (d > NEAR_HOME_M) d = geodesicDistance(h.lat, h.lon, lat[i], lon[i]);
      distanceFromHomeM[i] = d;
      if (far < 0 || d > distanceFromHomeM[far]) far = i;
    }
  }
  const home = homeIndex >= 0 ? point(series, homeIndex) : null;
  const maxDistanceFromHomeM = home && far >= 0 ? geodesicDistance(home.lat, home.lon, lat[far], lon[far]) : null;

  // Distance and speed from credited steps after home.
  const from = Math.max(0, homeIndex);
  let distanceM = 0;
  let stepTimeS = 0;
  let maxStepMps = -Infinity;
  let winM = 0;
  let winS = 0;
  for (let i = from + 1; i < n; i++) {
    if (!Number.isFinite(steps.stepM[i])) continue;
    distanceM += steps.stepM[i];
    stepTimeS += steps.stepS[i];
    winM += steps.stepM[i];
    winS += steps.stepS[i];
    if (winS >= SPEED_WINDOW_S) {
      maxStepMps = Math.max(maxStepMps, winM / winS);
      winM = winS = 0;
    }
  }
  if (winS > 0 && maxStepMps === -Infinity) maxStepMps = winM / winS; // a run shorter than one window
  let logMax = -Infinity;
  let logSum = 0;
  let logCount = 0;
  for (let i = from; i < n; i++) {
    const v = speedMps[i];
    if (!(v >= 0) || !Number.isFinite(v)) continue;
    logMax = Math.max(logMax, v);
    logSum += v;
    logCount++;
  }
  const speedSource = logCount > 0 ? "log" : stepTimeS > 0 ? "steps" : null;

  // HDOP, held through rows without a position; reset at segment starts and explicit no-fix rows.
  let hdopWarnS = 0;
  let maxHdop = -Infinity;
  let held = NaN;
  for (let i = from; i < n; i++) {
    if (segmentStart[i] === 1) held = NaN;
    else if (i > from && held > th.hdopWarn && tS[i] > tS[i - 1]) hdopWarnS += tS[i] - tS[i - 1];
    if (classes[i] === FIX_BAD) held = NaN;
    else if (classes[i] === FIX_GOOD && Number.isFinite(hdop[i])) {
      held = hdop[i];
      maxHdop = Math.max(maxHdop, hdop[i]);
    }
  }

  const events: AnalysisEvent[] = [];
  let fixLostS = 0;
  const dAt = (i: number) => (i >= 0 ? orNull(distanceFromHomeM[i]) : null);
  for (const s of fixLostSpans(series, classes, homeIndex, th.minSats)) {
    fixLostS += s.endS - s.startS;
    const g = s.lastGoodIndex;
    events.push({
      kind: "fix-lost",
      startS: s.startS,
      endS: s.endS,
      lat: g >= 0 ? lat[g] : null,
      lon: g >= 0 ? lon[g] : null,
      distanceFromHomeM: dAt(g),
      peak: s.minSats,
      threshold: th.minSats,
      detail: { durationS: s.endS - s.startS, causes: s.causes, ...(s.minSats !== null ? { unit: "satellites" } : {}) },
    });
  }
  for (const j of steps.jumps) {
    if (j.toIndex < from) continue; // a cold start's wild fixes before home are not the run
    events.push({
      kind: "position-jump",
      startS: tS[j.toIndex],
      endS: tS[j.endIndex],
      lat: lat[j.fromIndex],
      lon: lon[j.fromIndex],
      distanceFromHomeM: dAt(j.fromIndex),
      peak: j.peakMps,
      threshold: bound.mps,
      detail: {
        durationS: tS[j.endIndex] - tS[j.toIndex],
        unit: "m/s",
        jumpM: j.jumpM,
        toLat: lat[j.toIndex],
        toLon: lon[j.toIndex],
        returned: j.returned,
        lastGoodS: tS[j.fromIndex],
      },
    });
  }
  events.sort((a, b) => a.startS - b.startS);

  return {
    home,
    homeSource: placed.source,
    armedIndex: placed.armedIndex,
    distanceM,
    movingS: stepTimeS,
    firstIndex,
    staleFixes,
    jumpBound: bound,
    maxDistanceFromHomeM,
    farthest: far >= 0 ? point(series, far) : null,
    maxSpeedMps: speedSource === "log" ? logMax : speedSource === "steps" ? maxStepMps : null,
    meanSpeedMps: speedSource === "log" ? logSum / logCount : speedSource === "steps" ? distanceM / stepTimeS : null,
    speedSource,
    hdopWarnS,
    maxHdop: orNull(maxHdop),
    fixLostS,
    usableFixes,
    distanceFromHomeM,
    usableFix,
    events,
  };
}

/**
 * Where the run proper starts: a receiver often reports the position where its last session ended
 * for a few fixes, dated then, before a fresh fix (common practice). Those fixes are a lead of at
 * most {@link STALE_MAX_SHARE} of the good fixes, followed by a pause longer than `gapS` and a move
 * of at least {@link STALE_MIN_M}; the latest such break wins. Pure, O(n).
 * @returns the first sample after the stale lead, 0 when there is none
 * @example
 * // tracks.gpx track 2: three fixes in 2003, then 12,495 km away in 2005 → the fourth fix
 * staleLead(tS, lat, lon, good, 1800); // => 3
 */
export function staleLead(tS: ArrayLike<number>, lat: ArrayLike<number>, lon: ArrayLike<number>, good: ArrayLike<number>, gapS: number): number {
  let total = 0;
  for (let i = 0; i < good.length; i++) if (good[i] === 1) total++;
  let cut = 0;
  let before = 0;
  let prev = -1;
  for (let i = 0; i < good.length && before <= STALE_MAX_SHARE * total; i++) {
    if (good[i] !== 1) continue;
    if (prev >= 0 && tS[i] - tS[prev] > gapS && geodesicDistance(lat[prev], lon[prev], lat[i], lon[i]) >= STALE_MIN_M) cut = i;
    before++;
    prev = i;
  }
  return cut;
}
