/**
 * Link health (DESIGN.md §5 "Link"): one link metric, its fades and losses, and its statistics.
 */
import { quantileSorted } from "simple-statistics";
import { spanEvent } from "./span-event";
import { findSpans, type Span } from "./spans";
import type { AnalysisEvent, BuildConfig, RunSeries, Thresholds } from "./types";

/** Which column the link is judged on: LQ %, else RSSI %, else RSSI dBm. */
export type LinkMetric = "lq" | "rssi-pct" | "rssi-dbm";

export interface LinkSummary {
  /** null when the log carries no LQ or RSSI at all. */
  metric: LinkMetric | null;
  unit: "%" | "dBm" | null;
  /** Below this the link is fading (% or dBm). */
  fadeThreshold: number | null;
  /** A fade ends at the first sample at or above this (threshold + hysteresis). */
  exitThreshold: number | null;
  min: number | null;
  median: number | null;
  /** 5th percentile, linear interpolation (R type 7, as simple-statistics quantileSorted). */
  p5: number | null;
  /** Time with the metric below the fade threshold, s (each value held until the next one). */
  timeBelowThresholdS: number;
  /** Total time inside link-lost events, s. */
  timeLostS: number;
  fadeCount: number;
  lostCount: number;
  /** Samples carrying the metric. */
  samples: number;
}

export interface LinkAnalysis {
  summary: LinkSummary;
  /** `link-fade` and `link-lost` events in time order. */
  events: AnalysisEvent[];
  /** Per sample: 1 when the link was up, 0 inside a link-lost event (e.g. for the range fit). */
  linked: Uint8Array;
}

/** Fields that show the logger was still receiving the vehicle while the link metric was absent. */
const OTHER_FIELDS = ["lat", "altM", "speedMps", "headingDeg", "sats", "voltageV", "currentA"] as const;

const hasAny = (a: ArrayLike<number>) => {
  for (let i = 0; i < a.length; i++) if (Number.isFinite(a[i])) return true;
  return false;
};

const minOver = (a: ArrayLike<number>, from: number, to: number) => {
  let m = Infinity;
  for (let i = from; i <= to; i++) if (a[i] < m) m = a[i];
  return m === Infinity ? null : m;
};

/** Median spacing of the samples that carry `m`, s; 0 with fewer than two. */
function typicalIntervalS(tS: ArrayLike<number>, m: ArrayLike<number>): number {
  // Typed, not a JS array: a million-sample run would otherwise put 8+ MB on the JS heap per list.
  const steps = new Float64Array(m.length);
  let k = 0;
  let prev = -1;
  for (let i = 0; i < m.length; i++) {
    if (!Number.isFinite(m[i]) || !Number.isFinite(tS[i])) continue;
    if (prev >= 0) steps[k++] = tS[i] - tS[prev];
    prev = i;
  }
  return k ? quantileSorted(steps.subarray(0, k).sort() as unknown as number[], 0.5) : 0;
}

/** Merges spans that overlap or touch (one ends where the next starts), recording their causes. */
function mergeSpans(spans: { span: Span; cause: string }[]): { span: Span; causes: string[] }[] {
  const sorted = [...spans].sort((a, b) => a.span.startS - b.span.startS);
  const out: { span: Span; causes: string[] }[] = [];
  for (const { span, cause } of sorted) {
    const cur = out[out.length - 1];
    if (cur && span.startS <= cur.span.endS) {
      cur.span = { ...cur.span, endIndex: Math.max(cur.span.endIndex, span.endIndex), endS: Math.max(cur.span.endS, span.endS) };
      if (!cur.causes.includes(cause)) cur.causes.push(cause);
    } else out.push({ span: { ...span }, causes: [cause] });
  }
  return out;
}

/**
 * Judges the radio link of one run (DESIGN.md §5). The metric is LQ % when the log has any LQ,
 * else RSSI %, else RSSI dBm. A **link fade** starts below the fade threshold (LQ < `lqFadePct`,
 * RSSI % < `rssiFadePct`, dBm < sensitivity + `dbmFadeMarginDb`, sensitivity from the build or
 * `defaultSensitivityDbm`), lasts ≥ `fadeMinS`, and ends only at a sample at or above threshold +
 * `hysteresisPct` (or `hysteresisDb`); missing samples never end it. A **link lost** is any of:
 * the metric at its floor (0 % LQ or RSSI) for ≥ `lostMinS`; the metric missing while armed and
 * other fields keep coming, for ≥ max(`lostMinS`, the metric's usual sample spacing) and only after
 * its first value (a sparser link column is not a loss; before its first value the link was not
 * up yet); or the failsafe flag raised (any duration). Overlapping causes give one event.
 * A loss inside a fade does not split the fade: the fade is reported around it, and both events
 * stand. Spans never bridge a reception gap (`segmentStart`). Events carry the position at their
 * start (see positionAt) and, when given, the distance from home.
 *
 * Cost: O(n log n) (sorting for the percentiles). Pure: inputs are only read.
 *
 * @param series the run; rssiDbm in dBm, rssiPct/lqPct in %, tS in s
 * @param th thresholds (see Thresholds)
 * @param build optional build (receiver sensitivity, dBm)
 * @param distanceFromHome optional per-sample distance from home, m (from the track module)
 * @returns summary, events and the per-sample link-up mask
 * @example
 * // 10 Hz, LQ 100 then 50 % for 1 s then 100 %
 * analyseLink(makeSeries(30, { lqPct: (i) => (i >= 10 && i < 20 ? 50 : 100) }), defaultThresholds("ground")).events;
 * // => [{ kind: "link-fade", startS: 1, endS: 2, peak: 50, threshold: 70, ... }]
 */
export function analyseLink(series: RunSeries, th: Thresholds, build?: BuildConfig, distanceFromHome?: ArrayLike<number>): LinkAnalysis {
  const { tS, n } = series;
  const metric: LinkMetric | null = hasAny(series.lqPct) ? "lq" : hasAny(series.rssiPct) ? "rssi-pct" : hasAny(series.rssiDbm) ? "rssi-dbm" : null;
  const m = metric === "lq" ? series.lqPct : metric === "rssi-pct" ? series.rssiPct : series.rssiDbm;
  const unit = metric === null ? null : metric === "rssi-dbm" ? "dBm" : "%";
  const fadeThreshold =
    metric === "lq" ? th.lqFadePct
    : metric === "rssi-pct" ? th.rssiFadePct
    : metric === "rssi-dbm" ? (build?.rxSensitivityDbm ?? th.defaultSensitivityDbm) + th.dbmFadeMarginDb
    : null;
  const exitThreshold = fadeThreshold === null ? null : fadeThreshold + (metric === "rssi-dbm" ? th.hysteresisDb : th.hysteresisPct);
  const breakBefore = (i: number) => series.segmentStart[i] === 1;
  const has = (i: number) => Number.isFinite(m[i]);
  const detailBase = { metric, unit };

  const fades =
    metric === null ? []
    : findSpans(tS, (i) => m[i] < fadeThreshold!, { minDurationS: th.fadeMinS, exit: (i) => m[i] >= exitThreshold!, breakBefore });

  const lost: { span: Span; cause: string }[] = [];
  if (metric === "lq" || metric === "rssi-pct")
    for (const span of findSpans(tS, (i) => m[i] <= 0, { minDurationS: th.lostMinS, exit: (i) => m[i] > 0, breakBefore })) lost.push({ span, cause: "floor" });
  if (metric !== null) {
    let first = 0;
    while (first < n && !has(first)) first++;
    const other = (i: number) => OTHER_FIELDS.some((f) => Number.isFinite(series[f][i]));
    const silent = (i: number) => i > first && !has(i) && series.armed[i] === 1 && other(i);
    const minDurationS = Math.max(th.lostMinS, typicalIntervalS(tS, m));
    for (const span of findSpans(tS, silent, { minDurationS, breakBefore })) lost.push({ span, cause: "no-metric" });
  }
  const flag = series.failsafe;
  for (const span of findSpans(tS, (i) => flag[i] === 1, { minDurationS: 0, exit: (i) => flag[i] === 0, breakBefore })) lost.push({ span, cause: "failsafe-flag" });
  const losses = mergeSpans(lost);

  const linked = new Uint8Array(n).fill(1);
  for (const { span } of losses) linked.fill(0, span.startIndex, span.endIndex + 1);

  const events: AnalysisEvent[] = [
    ...fades.map((span) =>
      spanEvent("link-fade", span, series, {
        peak: minOver(m, span.startIndex, span.endIndex),
        threshold: fadeThreshold,
        distanceFromHome,
        detail: { ...detailBase, exitThreshold, containsLoss: losses.some((l) => l.span.startS < span.endS && l.span.endS > span.startS) },
      }),
    ),
    ...losses.map(({ span, causes }) =>
      spanEvent("link-lost", span, series, {
        peak: metric === null ? null : minOver(m, span.startIndex, span.endIndex),
        threshold: causes.includes("floor") ? 0 : null,
        distanceFromHome,
        detail: { ...detailBase, causes, minDurationS: th.lostMinS },
      }),
    ),
  ].sort((a, b) => a.startS - b.startS);

  const all = new Float64Array(n);
  let count = 0;
  let timeBelowThresholdS = 0;
  let prev = -1;
  let gap = false; // a reception gap since the previous value: its time is not claimed
  for (let i = 0; i < n; i++) {
    gap ||= breakBefore(i);
    if (!has(i) || !Number.isFinite(tS[i])) continue;
    all[count++] = m[i];
    if (prev >= 0 && !gap && m[prev] < fadeThreshold!) timeBelowThresholdS += tS[i] - tS[prev];
    prev = i;
    gap = false;
  }
  const values = all.subarray(0, count).sort() as unknown as number[]; // typed sort: numeric order
  const q = (p: number) => (values.length ? quantileSorted(values, p) : null);

  return {
    summary: {
      metric,
      unit,
      fadeThreshold,
      exitThreshold,
      min: q(0),
      median: q(0.5),
      p5: q(0.05),
      timeBelowThresholdS,
      timeLostS: losses.reduce((s, l) => s + l.span.endS - l.span.startS, 0),
      fadeCount: fades.length,
      lostCount: losses.length,
      samples: values.length,
    },
    events,
    linked,
  };
}
