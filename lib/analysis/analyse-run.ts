import { quantileSorted } from "simple-statistics";
import type { HomeInfo, NotAssessed } from "./evidence";
import { analyseFailsafe, NO_LOSS_WHY } from "./failsafe";
import { classifyModeName } from "./failsafe-modes";
import { analyseLink } from "./link";
import { findMissionStart } from "./mission-start";
import { analysePower } from "./power";
import { estimateRange } from "./range";
import { analyseRoute } from "./route";
import { defaultThresholds } from "./thresholds";
import { analyseTrack } from "./track";
import type { AnalysisEvent, BuildConfig, RoutePlanInput, RunSeries, Thresholds } from "./types";
import { judgeRun } from "./verdict";

export interface AnalyseRunOptions {
  build?: BuildConfig;
  plan?: RoutePlanInput;
  /** Defaults for the build's vehicle type when absent. */
  thresholds?: Thresholds;
  /** False when the parser found the log's times unusable (`timesUsable(warnings)`): time figures are not given. Default true. */
  timesUsable?: boolean;
}

/** Why a run has no time figures when its times cannot pace it. */
export const NO_TIMES_WHY = "the log's times cannot pace it (none, too few, or one placeholder on every point)";

/**
 * The run's duration, s: the span of its sample times from `from` on (max − min, so a log whose
 * times step backwards is never negative); 0 for an empty run.
 */
export function runDuration(tS: ArrayLike<number>, from = 0): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = from; i < tS.length; i++) {
    const t = tS[i];
    if (t < lo) lo = t;
    if (t > hi) hi = t;
  }
  return hi >= lo ? hi - lo : 0;
}

/** |x| of the finite values, sorted ascending, in a typed array (no boxed copies of a million values). */
function absFiniteSorted(x: ArrayLike<number>): Float64Array {
  let k = 0;
  for (let i = 0; i < x.length; i++) if (Number.isFinite(x[i])) k++;
  const out = new Float64Array(k);
  for (let i = 0, j = 0; i < x.length; i++) if (Number.isFinite(x[i])) out[j++] = Math.abs(x[i]);
  return out.sort();
}

const round = (v: number | null | undefined, digits = 2) => (v == null || !Number.isFinite(v) ? null : Number(v.toFixed(digits)));

/**
 * The whole analysis of one run: track first (home, distance from home per sample), then link,
 * failsafe, route, power and range, then the verdict. Pure; one pass per module over the arrays.
 * @returns `summary` (the figures of the debrief, SI units), `events` sorted by start time, and
 *   `perSample` derived arrays (distance from home, m; cross-track error, m, null without a plan)
 * @example analyseRun(series, { build, plan }).summary.verdict // => { level: "act", reasons: ["Link lost once", …] }
 */
export function analyseRun(series: RunSeries, opts: AnalyseRunOptions = {}) {
  const th = opts.thresholds ?? defaultThresholds(opts.build?.vehicleType ?? "ground");
  const timed = opts.timesUsable ?? true;
  const track = analyseTrack(series, th, { timesUsable: timed });
  const fromHome = track.distanceFromHomeM;
  // DESIGN.md §10 "Bench failsafe test": no usable fix → analysed for link and failsafe only.
  const bench = track.usableFixes === 0;
  const link = analyseLink(series, th, opts.build, fromHome);
  const linkLost = link.events.filter((e) => e.kind === "link-lost");
  const failsafe = analyseFailsafe(series, linkLost, opts.build, th, { distanceFromHome: fromHome, usableFix: track.usableFix });
  const rthSpans = failsafe.events.filter((e) => e.kind === "return-to-home").map((e) => ({ startS: e.startS, endS: e.endS }));
  const homeIndex = track.home?.index ?? -1;
  const mission = opts.plan && !bench ? findMissionStart(series, opts.build, { homeIndex, usableFix: track.usableFix, distanceFromHomeM: fromHome }) : null;
  const start = mission && mission.index >= 0 && mission.position ? { index: mission.index, ...mission.position } : undefined;
  const route =
    opts.plan && !bench
      ? analyseRoute(series, opts.plan, th, {
          distanceFromHome: fromHome, rthSpans, usableFix: track.usableFix, home: track.home, start, suspended: suspendedMask(series, mission?.engaged ?? null, start?.index ?? 0),
        })
      : null;
  const power = analysePower(series, th, opts.build, fromHome);
  const sensitivity = opts.build?.rxSensitivityDbm ?? th.defaultSensitivityDbm;
  const range = estimateRange(series.rssiDbm, fromHome, { sensitivityDbm: sensitivity, fadeMarginDb: th.dbmFadeMarginDb, bandMhz: opts.build?.bandMhz, linked: link.linked });

  const events: AnalysisEvent[] = [...track.events, ...link.events, ...failsafe.events, ...(route?.events ?? []), ...power.events].sort(
    (a, b) => a.startS - b.startS || a.endS - b.endS,
  );
  const count = (kind: AnalysisEvent["kind"]) => events.filter((e) => e.kind === kind).length;
  const notAssessed = assessmentGaps({
    linkMetric: link.summary.metric,
    linkNote: link.summary.note,
    hasBuild: opts.build !== undefined,
    benchLoss: bench && link.summary.lostCount > 0,
    failsafeResult: failsafe.outcome,
    failsafeWhy: failsafe.why,
    hasPlan: opts.plan !== undefined,
    bench,
    hasVoltage: power.restingV !== null || power.minUnderLoadV !== null,
    cells: power.cells,
  });
  const verdict = judgeRun({
    // On the bench the loss is the test (the transmitter switched off on purpose): not a fault of the run.
    linkLost: bench ? 0 : count("link-lost"),
    linkFades: count("link-fade"),
    failsafeResult: failsafe.outcome,
    offRoute: count("off-route"),
    waypointsMissed: route?.missed ?? [],
    lowVoltage: count("low-voltage"),
    fixLost: count("fix-lost"),
    positionJumps: count("position-jump"),
    hdopWarnS: track.hdopWarnS,
    notAssessed,
  });
  const home: HomeInfo | null = track.home
    ? {
        lat: track.home.lat,
        lon: track.home.lon,
        tS: track.home.tS,
        source: track.homeSource!,
        sats: Number.isFinite(series.sats[track.home.index]) ? series.sats[track.home.index] : null,
        hdop: Number.isFinite(series.hdop[track.home.index]) ? series.hdop[track.home.index] : null,
      }
    : null;
  const sorted = route ? absFiniteSorted(route.xteM) : new Float64Array(0);
  let sq = 0;
  for (let i = 0; i < sorted.length; i++) sq += sorted[i] * sorted[i];
  const rms = sorted.length ? Math.sqrt(sq / sorted.length) : null;
  // simple-statistics types its input as number[]; a Float64Array works the same at run time.
  const p95 = sorted.length ? quantileSorted(sorted as unknown as number[], 0.95) : null;

  const summary = {
    // Null without a usable clock: the figure is "not available", not zero.
    durationS: timed ? round(runDuration(series.tS, track.firstIndex), 3) : null,
    // The extent of the sample clock (for an untimed log, the sample numbering): the charts' x axis.
    timelineS: round(runDuration(series.tS), 3),
    distanceM: round(track.distanceM, 1),
    maxDistanceFromHomeM: round(track.maxDistanceFromHomeM, 1),
    maxSpeedMps: timed ? round(track.maxSpeedMps) : null,
    bench,
    home,
    timing: { usable: timed, why: timed ? null : NO_TIMES_WHY },
    track: {
      movingS: timed ? round(track.movingS, 1) : null,
      meanSpeedMps: timed ? round(track.meanSpeedMps) : null,
      jumpBoundMps: timed ? round(track.jumpBound.mps, 1) : null,
      jumpBoundFrom: track.jumpBound.from,
      staleFixes: track.staleFixes,
    },
    gps: { fixLostS: timed ? round(track.fixLostS) : null, hdopWarnS: timed ? round(track.hdopWarnS) : null, maxHdop: round(track.maxHdop) },
    link: {
      metric: link.summary.metric,
      unit: link.summary.unit,
      source: link.summary.source,
      note: link.summary.note,
      fadeCount: link.summary.fadeCount,
      lostCount: link.summary.lostCount,
      min: round(link.summary.min),
      median: round(link.summary.median),
      p5: round(link.summary.p5),
      timeBelowFadeS: round(link.summary.timeBelowThresholdS),
      fadeThreshold: link.summary.fadeThreshold,
    },
    failsafe: {
      result: failsafe.outcome,
      // The figure and the verdict give the same reason.
      why: notAssessed.find((g) => g.what === "failsafe")?.why ?? failsafe.why,
      plan: failsafe.plan,
      commanded: failsafe.decisive?.commanded ?? null,
      flown: failsafe.decisive?.flown ?? null,
      latencyS: round(failsafe.decisive?.failsafeLatencyS ?? null),
      actionLatencyS: round(failsafe.decisive?.actionLatencyS ?? null),
      action: failsafe.decisive?.action ?? null,
    },
    route: route
      ? {
          start: mission && start ? { source: mission.source!, startS: series.tS[start.index], lat: start.lat, lon: start.lon } : null,
          xteRmsM: round(rms),
          xteP95M: round(p95),
          xteMaxM: round(sorted.length ? sorted[sorted.length - 1] : null),
          waypointsReached: route.reached,
          waypointsMissed: route.missed,
          waypointsNotReached: route.notReached,
          // A first leg never flown (the mission started inside waypoint 1's circle) is not a leg of this run.
          legs: route.legs
            .filter((l) => !(l.index === 0 && start && l.samples === 0))
            .map((l) => ({ from: l.from, to: l.to, rmsXteM: round(l.rmsXteM), p95XteM: round(l.p95XteM), maxXteM: round(l.maxXteM) })),
        }
      : null,
    power: {
      cells: power.cells,
      cellsFrom: power.cellsFrom,
      minCellV: round(power.minUnderLoadPerCellV, 3),
      sagV: round(power.sagV),
      capacityUsedMah: round(power.usedMah, 0),
    },
    range: range.estimate
      ? {
          pathLossExponent: round(range.estimate.pathLossExponent),
          r2: round(range.estimate.r2, 3),
          // A fit that is not credible keeps its line for the range view but quotes no range.
          credible: range.estimate.credible,
          notCredibleWhy: range.estimate.notCredibleWhy,
          estimatedRangeM: range.estimate.credible ? round(range.estimate.estimatedRangeM, 0) : null,
          marginAtFarthestDb: round(range.estimate.marginAtFarthestDb, 1),
          farthestM: round(range.estimate.farthestM, 0),
          samples: range.estimate.samples,
          label: range.estimate.label,
          // For the range chart: the fitted line, the level it runs out at, and the free-space reference.
          p0Dbm: round(range.estimate.p0Dbm, 1),
          thresholdDbm: round(range.estimate.thresholdDbm, 1),
          freeSpaceRangeM: round(range.estimate.freeSpace?.rangeM ?? null, 0),
        }
      : { pathLossExponent: null, r2: null, estimatedRangeM: null, reason: range.reason },
    verdict,
    thresholds: th,
  };
  // Per-sample values the display levels store beside the samples (lib/series); not part of the summary.
  const perSample = { distanceFromHomeM: fromHome, xteM: route ? route.xteM : null, rssiRcPct: link.rcRssiPct };
  return { summary, events, perSample };
}

export type RunAnalysis = ReturnType<typeof analyseRun>;

/**
 * Per sample: 1 where route following is suspended besides return-to-home (which the route
 * module gets as spans): a land or hold mode, and — when a mission mode or channel shows the
 * mission — after its start while it is not engaged (the pilot took over or it ended).
 */
function suspendedMask(series: RunSeries, engaged: Uint8Array | null, from: number): Uint8Array {
  const out = new Uint8Array(series.n);
  const classes = series.modeNames.map(classifyModeName);
  for (let i = 0, held = NaN; i < series.n; i++) {
    if (Number.isFinite(series.modeIndex[i])) held = series.modeIndex[i];
    const action = Number.isFinite(held) ? classes[held]?.action : null;
    if (action === "land" || action === "hold" || (engaged && i >= from && !engaged[i])) out[i] = 1;
  }
  return out;
}

/** Why a bench run's link is not judged: the loss is the stimulus of the failsafe test. */
export const BENCH_LOSS_WHY = "a bench test: the link was switched off on purpose to test the failsafe, so the loss is not a finding";
/** Why the failsafe is not assessed when the log has no link metric (and no failsafe flag raised). */
export const NO_METRIC_FAILSAFE_WHY = "the log has no link metric, so a link loss — and the failsafe it would trigger — cannot be seen";

/** What the analysis knows about the evidence in the log, for {@link assessmentGaps}. */
export interface EvidenceFacts {
  linkMetric: string | null;
  linkNote: string | null;
  hasBuild: boolean;
  /** A bench run whose link was lost: the loss is the test, not a finding about the link. */
  benchLoss: boolean;
  failsafeResult: string;
  failsafeWhy: string | null;
  hasPlan: boolean;
  bench: boolean;
  hasVoltage: boolean;
  cells: number | null;
}

/**
 * The parts of the run the log cannot show, each with why (DESIGN.md §10 "Evidence, not
 * absence"): no link metric, a failsafe not exercised or not judgeable, no route plan or no fix,
 * no voltage or no cell count, no GPS fix. Pure.
 */
export function assessmentGaps(f: EvidenceFacts): NotAssessed[] {
  const gaps: NotAssessed[] = [];
  if (f.linkMetric === null)
    gaps.push({
      what: "link",
      why:
        f.linkNote ??
        (f.hasBuild
          ? "the log has no link metric: no RSSI or LQ column, and the build's link sheet names no RSSI channel"
          : "the log has no link metric: no RSSI or LQ column, and no build with an RSSI channel on its link sheet"),
    });
  else if (f.benchLoss) gaps.push({ what: "link", why: BENCH_LOSS_WHY });
  if (f.failsafeResult === "not-assessed") {
    // Without a link metric "no loss" is not evidence that the link held.
    const why = f.linkMetric === null && f.failsafeWhy === NO_LOSS_WHY ? NO_METRIC_FAILSAFE_WHY : (f.failsafeWhy ?? "not exercised");
    gaps.push({ what: "failsafe", why });
  }
  if (!f.hasPlan) gaps.push({ what: "route", why: "no route plan is attached to the run" });
  else if (f.bench) gaps.push({ what: "route", why: "the log has no usable GPS fix" });
  if (!f.hasVoltage) gaps.push({ what: "battery", why: "the log has no battery voltage" });
  else if (f.cells === null) gaps.push({ what: "battery", why: "the cell count is unknown: set it on the build" });
  if (f.bench) gaps.push({ what: "gps", why: "the log has no usable GPS fix (a bench test, or indoors)" });
  return gaps;
}
