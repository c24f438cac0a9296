/**
 * Link health (DESIGN.md §5 "Link"): one link metric, its fades and losses, and its statistics.
 */
import { quantileSorted } from "simple-statistics";
import { pwmToPct } from "@/lib/parsers/csv-values";
import { RC_CHANNELS } from "@/lib/parsers/types";
import type { LinkSource } from "./evidence";
import { spanEvent } from "./span-event";
import { findSpans, type Span } from "./spans";
import type { AnalysisEvent, BuildConfig, RunSeries, Thresholds } from "./types";

/** Which column the link is judged on: LQ %, else RSSI %, else RSSI dBm. */
export type LinkMetric = "lq" | "rssi-pct" | "rssi-dbm";

export interface LinkSummary {
  /** null when the log carries no LQ or RSSI at all. */
  metric: LinkMetric | null;
  unit: "%" | "dBm" | null;
  /** A column of the log, or the link sheet's RSSI channel; null without a metric. */
  source: LinkSource | null;
  /** What the reader should know about the choice (e.g. the sheet's RSSI channel was present but not used). */
  note: string | null;
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
  /** Per sample: RSSI % read from the link sheet's RSSI channel, when that is the metric; else null. */
  rcRssiPct: Float64Array | null;
}

/** The link metric the run is judged on, where it came from, and its values. */
export interface ChosenLinkMetric {
  metric: LinkMetric | null;
  values: ArrayLike<number>;
  source: LinkSource | null;
  note: string | null;
  /** Set when the values were read from an RC channel (for the display levels). */
  derived: Float64Array | null;
}

const lettersOnly = (s: string) => s.toLowerCase().replace(/[^a-z]/g, "");

/** The link sheet's RSSI channel (function "rssi"), or null. */
export function rssiChannelOf(build: BuildConfig | undefined): number | null {
  const c = build?.channels?.find((ch) => lettersOnly(ch.function) === "rssi" && ch.channel >= 1 && ch.channel <= RC_CHANNELS);
  return c ? c.channel : null;
}

/**
 * RSSI % per sample from RC channel `channel` (1-based): 1000 µs = 0 %, 2000 µs = 100 %, clamped
 * (the receiver's usual mapping, DESIGN.md §4/§10, common practice); NaN where the channel carries
 * no pulse (0 = absent). Null when the log has no RC data or the channel never carries a value.
 */
export function rssiFromChannel(series: Pick<RunSeries, "n" | "rc">, channel: number): Float64Array | null {
  const { n, rc } = series;
  if (!rc) return null;
  const out = new Float64Array(n);
  let any = false;
  for (let i = 0; i < n; i++) {
    const us = rc[i * RC_CHANNELS + channel - 1];
    if (us > 0) {
      out[i] = pwmToPct(us);
      any = true;
    } else out[i] = NaN;
  }
  return any ? out : null;
}

/**
 * Chooses the link metric (DESIGN.md §5, §10): LQ % when the log has any LQ, else RSSI %, else
 * RSSI dBm — a column of the log always wins; only when the log has none of them and the build's
 * link sheet names an RSSI channel is RSSI % read from that RC channel. When both exist the column
 * is used and `note` says the channel was not.
 *
 * Cost: O(n). Pure.
 */
export function chooseLinkMetric(series: RunSeries, build?: BuildConfig): ChosenLinkMetric {
  const column: LinkMetric | null = hasAny(series.lqPct) ? "lq" : hasAny(series.rssiPct) ? "rssi-pct" : hasAny(series.rssiDbm) ? "rssi-dbm" : null;
  const channel = rssiChannelOf(build);
  const fromChannel = channel !== null ? rssiFromChannel(series, channel) : null;
  if (column !== null) {
    const values = column === "lq" ? series.lqPct : column === "rssi-pct" ? series.rssiPct : series.rssiDbm;
    const name = column === "lq" ? "LQ" : "RSSI";
    const note = fromChannel ? `The log also carries RSSI on channel ${channel} (link sheet); the logged ${name} column was used` : null;
    return { metric: column, values, source: { kind: "column" }, note, derived: null };
  }
  if (fromChannel && channel !== null) return { metric: "rssi-pct", values: fromChannel, source: { kind: "rc-channel", channel }, note: null, derived: fromChannel };
  const note = channel !== null ? `The link sheet names channel ${channel} for RSSI, but the log carries no values on it` : null;
  return { metric: null, values: series.rssiDbm, source: null, note, derived: null };
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
 * One incident, one event: a fade that runs into a loss is not reported on its own; the loss
 * carries its onset (`detail.fadeStartS`, before the loss) and the end of its recovery
 * (`detail.fadeEndS`, after it). Counts are incidents. Spans never bridge a reception gap (`segmentStart`). Events carry the position at their
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
  const chosen = chooseLinkMetric(series, build);
  const { metric, values: m } = chosen;
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

  // One incident, one event (DESIGN.md §10): a fade that runs into a loss is that loss's lead-in
  // (and recovery), not an event of its own.
  const touches = (f: Span, l: Span) => l.startS <= f.endS && l.endS >= f.startS;
  const lone = fades.filter((f) => !losses.some((l) => touches(f, l.span)));
  const leadIn = new Map<number, { fadeStartS?: number; fadeEndS?: number }>();
  for (const f of fades) {
    const hit = losses.map((l, k) => [l, k] as const).filter(([l]) => touches(f, l.span));
    if (!hit.length) continue;
    const [firstLoss, firstK] = hit[0];
    const [lastLoss, lastK] = hit[hit.length - 1];
    if (f.startS < firstLoss.span.startS) leadIn.set(firstK, { ...leadIn.get(firstK), fadeStartS: f.startS });
    if (f.endS > lastLoss.span.endS) leadIn.set(lastK, { ...leadIn.get(lastK), fadeEndS: f.endS });
  }
  const events: AnalysisEvent[] = [
    ...lone.map((span) =>
      spanEvent("link-fade", span, series, {
        peak: minOver(m, span.startIndex, span.endIndex),
        threshold: fadeThreshold,
        distanceFromHome,
        detail: { ...detailBase, exitThreshold },
      }),
    ),
    ...losses.map(({ span, causes }, k) =>
      spanEvent("link-lost", span, series, {
        peak: metric === null ? null : minOver(m, span.startIndex, span.endIndex),
        threshold: causes.includes("floor") ? 0 : null,
        distanceFromHome,
        detail: { ...detailBase, causes, minDurationS: th.lostMinS, ...leadIn.get(k) },
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
      source: chosen.source,
      note: chosen.note,
      fadeThreshold,
      exitThreshold,
      min: q(0),
      median: q(0.5),
      p5: q(0.05),
      timeBelowThresholdS,
      timeLostS: losses.reduce((s, l) => s + l.span.endS - l.span.startS, 0),
      fadeCount: lone.length,
      lostCount: losses.length,
      samples: values.length,
    },
    events,
    linked,
    rcRssiPct: chosen.derived,
  };
}
