/**
 * What the charts ask the series endpoint for. Pure, so the request keys can be tested: the key
 * is what decides whether SWR re-fetches, so it must not change on every pixel of a drag.
 */
import type { SeriesField } from "@/lib/series/types";
import type { TimeRange } from "./pan-zoom";

/** The charts never ask for more than this many x positions (a screen shows no more). */
export const MAX_CHART_POINTS = 2000;
/** Widths are bucketed so a resize by a few pixels does not re-fetch. */
export const POINTS_BUCKET = 100;
/** Zoom windows are rounded outward to a step of about this share of their span. */
export const RANGE_ROUNDING = 1 / 20;

/** Target number of x positions for a plot this many CSS pixels wide. */
export function pointsForWidth(widthPx: number): number {
  if (!(widthPx > 0)) return POINTS_BUCKET;
  return Math.min(MAX_CHART_POINTS, Math.max(POINTS_BUCKET, Math.ceil(widthPx / POINTS_BUCKET) * POINTS_BUCKET));
}

/** The smallest 1, 2 or 5 × 10^k that is ≥ x. */
export function niceStep(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const mag = 10 ** Math.floor(Math.log10(x));
  for (const m of [1, 2, 5, 10]) if (m * mag >= x * (1 - 1e-12)) return m * mag;
  return 10 * mag;
}

/**
 * The window to fetch for a view: rounded outward to a nice step (so nearby views share a key and
 * the fetched data covers the view), clamped to the run. Null (whole run) stays null.
 */
export function roundRangeForFetch(r: TimeRange | null, durationS: number): TimeRange | null {
  if (r == null) return null;
  const span = Math.max(r.to - r.from, 1e-3);
  const step = niceStep(span * RANGE_ROUNDING);
  const digits = Math.max(0, -Math.floor(Math.log10(step)));
  let from = Number((Math.floor(r.from / step) * step).toFixed(digits));
  let to = Number((Math.ceil(r.to / step) * step).toFixed(digits));
  from = Math.max(0, from);
  if (durationS > 0) to = Math.min(durationS, to);
  if (from <= 0 && durationS > 0 && to >= durationS) return null;
  return { from, to };
}

/**
 * Where a run's data endpoints live: `/api/runs/{id}` for the crew, or a share link's
 * `/api/share/{token}`, which serves the same answers for its one run.
 */
export function runApiBase(runId: number, apiBase?: string): string {
  return apiBase ?? `/api/runs/${encodeURIComponent(String(runId))}`;
}

/**
 * `/api/runs/{id}/series?fields=a,b&points=n[&from=&to=][&v=]`. `version` (from an earlier answer)
 * lets the browser keep the answer for good; it changes when the run is re-analysed.
 */
export function seriesUrl(
  runId: number,
  fields: readonly SeriesField[],
  range: TimeRange | null,
  points: number,
  version?: string,
  apiBase?: string,
): string {
  let url = `${runApiBase(runId, apiBase)}/series?fields=${fields.join(",")}&points=${Math.round(points)}`;
  if (range) url += `&from=${range.from}&to=${range.to}`;
  if (version) url += `&v=${encodeURIComponent(version)}`;
  return url;
}

/** `/api/runs/{id}/points?fields=a,b&points=n` (or under `apiBase`) */
export function pointsUrl(runId: number, fields: readonly SeriesField[], points: number, version?: string, apiBase?: string): string {
  const v = version ? `&v=${encodeURIComponent(version)}` : "";
  return `${runApiBase(runId, apiBase)}/points?fields=${fields.join(",")}&points=${Math.round(points)}${v}`;
}

/** `/api/runs/{id}/track[?v=]` (or under `apiBase`) */
export function trackUrl(runId: number, version?: string, apiBase?: string): string {
  return `${runApiBase(runId, apiBase)}/track${version ? `?v=${encodeURIComponent(version)}` : ""}`;
}
