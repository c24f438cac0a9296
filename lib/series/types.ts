/**
 * What the debrief's charts and map read: the wire shapes of the series, track and points
 * endpoints. Shared by the route handlers (server) and the chart and map components (browser),
 * so this file imports nothing but the sample field list.
 */
import { sampleFields } from "@/lib/parsers/types";

/** Values the analysis derives for every sample and stores beside the samples' display levels. */
export const derivedFields = [
  "distanceFromHomeM", // m from home (first good fix), NaN before it
  "xteM", // signed cross-track error to the active leg, m (+ right), NaN without a route plan
  "rssiRcPct", // RSSI % read from the link sheet's RSSI channel (1000–2000 µs), when that is the judged metric
] as const;

/** Every field a chart may ask for: the stored sample fields (without tS) and the derived ones. */
export const seriesFields = [...sampleFields.filter((f) => f !== "tS"), ...derivedFields] as const;
export type SeriesField = (typeof sampleFields)[number] | (typeof derivedFields)[number];

/** At most this many points per request; more is never useful on a screen. */
export const MAX_POINTS = 5000;

/**
 * `GET /api/runs/{id}/series?fields=a,b&from=&to=&points=`
 * from/to: seconds from the run's first sample (default: the whole run); points: target number of
 * x positions (default 2000, at most MAX_POINTS).
 * All three endpoints also take `v=<version>` (see `version`): a URL carrying the run's current
 * version is answered as cacheable for good; without it, responses carry an ETag and revalidate.
 * 422 for an unknown field or a bad number, 409 while the run is not ready, 404 for a run of
 * another crew.
 */
export interface SeriesResponse {
  runId: number;
  /** Always set by the server; changes when the run is re-parsed or re-analysed. Pass it back as `v` to let the browser keep answers. */
  version?: string;
  /** The range actually covered, s from the first sample. */
  from: number;
  to: number;
  /** "raw" when every sample in the range is returned; otherwise the samples per bucket of the level used. */
  resolution: "raw" | number;
  /** x positions, s from the first sample, non-decreasing. */
  t: number[];
  /**
   * One array per requested field, aligned with `t`; null = no value there. A reception gap
   * (segment break, or a time step far longer than the run's usual one) is a null on every field,
   * so a chart draws a break rather than a line across it. Decimated levels give each bucket two
   * x positions carrying its minimum and maximum in time order, so peaks and fades survive.
   */
  values: Partial<Record<SeriesField, (number | null)[]>>;
  /** Requested fields that have no value anywhere in the run (left out of `values`). */
  absent: SeriesField[];
}

/** Link metrics a track can be coloured by, best first. */
export const trackMetrics = ["lqPct", "rssiPct", "rssiDbm", "snrDb"] as const; // the analysis' order (lib/analysis/link.ts)
export type TrackMetric = (typeof trackMetrics)[number];

/**
 * `GET /api/runs/{id}/track` — the flown track for the map, at most ~4000 points: in each bucket of
 * consecutive samples, the one with the worst link (so a fade shows on the map), else the first
 * sample with a position. Columnar, time order; only samples with a position.
 */
export interface TrackResponse {
  runId: number;
  version?: string;
  /** The metric `link` holds, or null when the log has no link metric. */
  metric: { field: TrackMetric; unit: "%" | "dBm" | "dB" } | null;
  t: number[];
  lat: number[];
  lon: number[];
  link: (number | null)[];
  /**
   * Indices into `t` where a new piece starts (reception gap, segment break, or no position for a
   * while): draw separate lines. The first piece starts at 0, which is not listed.
   */
  breaks: number[];
}

/**
 * `GET /api/runs/{id}/points?fields=a,b&points=` — actual samples (not envelopes) picked at an even
 * stride among those where every requested field has a value; for scatter plots such as RSSI
 * against distance. Default 2000 points, at most MAX_POINTS.
 */
export interface PointsResponse {
  runId: number;
  version?: string;
  t: number[];
  values: Partial<Record<SeriesField, number[]>>;
  /** How many samples qualified in total (before the stride). */
  total: number;
}
