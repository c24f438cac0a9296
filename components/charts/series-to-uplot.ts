/**
 * Turns the series endpoint's response into what uPlot draws. Pure: no DOM, no uPlot import.
 */
import type { SeriesField, SeriesResponse } from "@/lib/series/types";

/** uPlot's AlignedData for one x array and some y arrays; null = gap. */
export type AlignedSeries = [number[], ...(number | null)[][]];

export type Converters = Partial<Record<SeriesField, (v: number) => number>>;

/**
 * One x array (`t`) and one y array per requested field, in the order given. A field the response
 * lacks becomes all nulls; non-finite values and nulls stay gaps; values go through `convert`.
 */
export function toAlignedData(res: SeriesResponse, fields: readonly SeriesField[], convert?: Converters): AlignedSeries {
  const n = res.t.length;
  const out: AlignedSeries = [res.t.slice()];
  for (const f of fields) {
    const src = res.values[f];
    const fn = convert?.[f];
    const col: (number | null)[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const v = src ? src[i] : null;
      if (v == null || !Number.isFinite(v)) col[i] = null;
      else {
        const c = fn ? fn(v) : v;
        col[i] = Number.isFinite(c) ? c : null;
      }
    }
    out.push(col);
  }
  return out;
}

/** Every field of every panel, once each, in first-seen order (one request serves all panels). */
export function unionFields(panels: readonly { series: readonly { field: SeriesField }[] }[]): SeriesField[] {
  const seen = new Set<SeriesField>();
  for (const p of panels) for (const s of p.series) seen.add(s.field);
  return [...seen];
}

/** The fields of a panel the log actually has (absent = no value anywhere in the run). */
export function presentFields(res: Pick<SeriesResponse, "absent">, fields: readonly SeriesField[]): SeriesField[] {
  const absent = new Set(res.absent);
  return fields.filter((f) => !absent.has(f));
}

/** "No RSSI in this log." / "No LQ or SNR in this log." / "No A, B or C in this log." */
export function absentMessage(labels: readonly string[]): string {
  const names = [...new Set(labels.filter((l) => l.trim() !== ""))];
  if (names.length === 0) return "No data for this chart in this log.";
  const list = names.length === 1 ? names[0] : `${names.slice(0, -1).join(", ")} or ${names[names.length - 1]}`;
  return `No ${list} in this log.`;
}

/**
 * Shows zoomed-in detail inside its window and the whole-run overview outside it, so panning
 * never shows an empty stretch while the next detail request is on its way. Fields missing from
 * either side are gaps there.
 */
export function mergeSeries(overview: SeriesResponse, detail: SeriesResponse | null | undefined): SeriesResponse {
  if (!detail || detail.t.length === 0) return overview;
  if (overview.t.length === 0) return detail;
  const lo = detail.from;
  const hi = detail.to;
  const fields = new Set<SeriesField>([
    ...(Object.keys(overview.values) as SeriesField[]),
    ...(Object.keys(detail.values) as SeriesField[]),
  ]);
  const t: number[] = [];
  const values: Partial<Record<SeriesField, (number | null)[]>> = {};
  for (const f of fields) values[f] = [];
  const take = (src: SeriesResponse, i: number) => {
    t.push(src.t[i]);
    for (const f of fields) values[f]!.push(src.values[f]?.[i] ?? null);
  };
  let i = 0;
  while (i < overview.t.length && overview.t[i] < lo) take(overview, i++);
  for (let j = 0; j < detail.t.length; j++) take(detail, j);
  while (i < overview.t.length && overview.t[i] <= hi) i++;
  while (i < overview.t.length) take(overview, i++);
  // The overview spans the whole run, so its `absent` is the authoritative one.
  return {
    runId: overview.runId,
    version: overview.version,
    from: overview.from,
    to: overview.to,
    resolution: detail.resolution,
    t,
    values,
    absent: overview.absent,
  };
}

/**
 * Indices of values with a gap (or the data's end) on both sides. A line chart draws nothing for
 * them, so the chart marks them as dots instead of losing them.
 */
export function isolatedIndices(ys: ArrayLike<number | null | undefined>): number[] {
  const out: number[] = [];
  const n = ys.length;
  for (let i = 0; i < n; i++) {
    if (ys[i] == null) continue;
    const prevGap = i === 0 || ys[i - 1] == null;
    const nextGap = i === n - 1 || ys[i + 1] == null;
    if (prevGap && nextGap) out.push(i);
  }
  return out;
}

/** How many x positions fall inside [min, max] (x sorted ascending). */
export function countInRange(xs: ArrayLike<number>, min: number, max: number): number {
  let lo = 0;
  let hi = xs.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] < min) lo = mid + 1;
    else hi = mid;
  }
  let a = lo;
  hi = xs.length;
  while (a < hi) {
    const mid = (a + hi) >> 1;
    if (xs[mid] <= max) a = mid + 1;
    else hi = mid;
  }
  return a - lo;
}

/** A legend/readout figure: fewer decimals for bigger magnitudes; "" for no value. */
export function formatValue(v: number | null | undefined): string {
  if (v == null || !Number.isFinite(v)) return "";
  const a = Math.abs(v);
  const digits = a >= 100 ? 0 : a >= 10 ? 1 : 2;
  const s = v.toFixed(digits);
  // "-0.0" reads as a sign error.
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s.replace("-", "−");
}

/**
 * A y range covering the data and the given extra values (thresholds), padded by `pad` of the
 * span on each side; a flat or empty series still gets a visible band.
 */
export function paddedRange(
  dataMin: number | null,
  dataMax: number | null,
  extras: readonly number[] = [],
  pad = 0.08,
): [number, number] {
  const vals = [dataMin, dataMax, ...extras].filter((v): v is number => v != null && Number.isFinite(v));
  if (vals.length === 0) return [0, 1];
  let lo = Math.min(...vals);
  let hi = Math.max(...vals);
  if (hi - lo < 1e-9) {
    const half = Math.max(Math.abs(lo) * 0.05, 1);
    return [lo - half, hi + half];
  }
  const d = (hi - lo) * pad;
  lo -= d;
  hi += d;
  return [lo, hi];
}
