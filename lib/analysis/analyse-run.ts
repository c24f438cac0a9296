import { quantileSorted } from "simple-statistics";
import { analyseFailsafe } from "./failsafe";
import { analyseLink } from "./link";
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
  const track = analyseTrack(series, th);
  const fromHome = track.distanceFromHomeM;
  const link = analyseLink(series, th, opts.build, fromHome);
  const linkLost = link.events.filter((e) => e.kind === "link-lost");
  const failsafe = analyseFailsafe(series, linkLost, opts.build, th, fromHome);
  const rthSpans = failsafe.events.filter((e) => e.kind === "return-to-home").map((e) => ({ startS: e.startS, endS: e.endS }));
  const route = opts.plan ? analyseRoute(series, opts.plan, th, { distanceFromHome: fromHome, rthSpans, usableFix: track.usableFix, home: track.home }) : null;
  const power = analysePower(series, th, opts.build, fromHome);
  const sensitivity = opts.build?.rxSensitivityDbm ?? th.defaultSensitivityDbm;
  const range = estimateRange(series.rssiDbm, fromHome, { sensitivityDbm: sensitivity, fadeMarginDb: th.dbmFadeMarginDb, bandMhz: opts.build?.bandMhz, linked: link.linked });

  const events: AnalysisEvent[] = [...track.events, ...link.events, ...failsafe.events, ...(route?.events ?? []), ...power.events].sort(
    (a, b) => a.startS - b.startS || a.endS - b.endS,
  );
  const count = (kind: AnalysisEvent["kind"]) => events.filter((e) => e.kind === kind).length;
  const verdict = judgeRun({
    linkLost: count("link-lost"),
    linkFades: count("link-fade"),
    failsafeResult: failsafe.outcome,
    offRoute: count("off-route"),
    waypointsMissed: route?.missed ?? [],
    lowVoltage: count("low-voltage"),
    fixLost: count("fix-lost"),
    positionJumps: count("position-jump"),
    hdopWarnS: track.hdopWarnS,
  });
  const sorted = route ? absFiniteSorted(route.xteM) : new Float64Array(0);
  let sq = 0;
  for (let i = 0; i < sorted.length; i++) sq += sorted[i] * sorted[i];
  const rms = sorted.length ? Math.sqrt(sq / sorted.length) : null;
  // simple-statistics types its input as number[]; a Float64Array works the same at run time.
  const p95 = sorted.length ? quantileSorted(sorted as unknown as number[], 0.95) : null;

  const summary = {
    durationS: series.n ? round(series.tS[series.n - 1] - series.tS[0], 3) : 0,
    distanceM: round(track.distanceM, 1),
    maxDistanceFromHomeM: round(track.maxDistanceFromHomeM, 1),
    maxSpeedMps: round(track.maxSpeedMps),
    home: track.home ? { lat: track.home.lat, lon: track.home.lon } : null,
    gps: { fixLostS: round(track.fixLostS), hdopWarnS: round(track.hdopWarnS), maxHdop: round(track.maxHdop) },
    link: {
      metric: link.summary.metric,
      unit: link.summary.unit,
      min: round(link.summary.min),
      median: round(link.summary.median),
      p5: round(link.summary.p5),
      timeBelowFadeS: round(link.summary.timeBelowThresholdS),
      fadeThreshold: link.summary.fadeThreshold,
    },
    failsafe: {
      result: failsafe.outcome,
      latencyS: round(failsafe.decisive?.failsafeLatencyS ?? null),
      actionLatencyS: round(failsafe.decisive?.actionLatencyS ?? null),
      action: failsafe.decisive?.action ?? null,
      plan: failsafe.plan,
    },
    route: route
      ? {
          xteRmsM: round(rms),
          xteP95M: round(p95),
          xteMaxM: round(sorted.length ? sorted[sorted.length - 1] : null),
          waypointsReached: route.reached,
          waypointsMissed: route.missed,
          waypointsNotReached: route.notReached,
          legs: route.legs.map((l) => ({ from: l.from, to: l.to, rmsXteM: round(l.rmsXteM), p95XteM: round(l.p95XteM), maxXteM: round(l.maxXteM) })),
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
          estimatedRangeM: round(range.estimate.estimatedRangeM, 0),
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
  const perSample = { distanceFromHomeM: fromHome, xteM: route ? route.xteM : null };
  return { summary, events, perSample };
}

export type RunAnalysis = ReturnType<typeof analyseRun>;
