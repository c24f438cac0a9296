/**
 * Turns a span of samples into a stored event: where it happened and how far from home.
 */
import type { Span } from "./spans";
import type { AnalysisEvent, EventKind, RunSeries } from "./types";

/** Where an event happened. Degrees WGS84 and metres; null when the log has no fix to give. */
export interface EventPosition {
  lat: number | null;
  lon: number | null;
  distanceFromHomeM: number | null;
}

const isFix = (lat: number, lon: number) => Number.isFinite(lat) && Number.isFinite(lon) && !(lat === 0 && lon === 0);

/**
 * The position of an event that starts at sample `startIndex`: the fix at that sample, else the
 * last fix before it (the vehicle's last known place), else the first fix up to `endIndex`.
 * Position 0,0 counts as no fix. `distanceFromHomeM` is read at the same sample (NaN → null).
 *
 * Cost: O(n) in the worst case (a log with no fix). Pure.
 *
 * @param series the run (only `lat`, `lon` are read)
 * @param startIndex first sample of the event
 * @param endIndex last sample of the event (inclusive); defaults to `startIndex`
 * @param distanceFromHome optional per-sample distance from home, m (from the track module)
 * @returns lat/lon in degrees and distance in m, each null when unknown
 * @example
 * positionAt({ lat: [NaN, 51.5, NaN], lon: [NaN, -0.1, NaN] }, 2); // => { lat: 51.5, lon: -0.1, distanceFromHomeM: null }
 */
export function positionAt(
  series: Pick<RunSeries, "lat" | "lon">,
  startIndex: number,
  endIndex = startIndex,
  distanceFromHome?: ArrayLike<number>,
): EventPosition {
  const { lat, lon } = series;
  let k = -1;
  for (let i = Math.min(startIndex, lat.length - 1); i >= 0 && k < 0; i--) if (isFix(lat[i], lon[i])) k = i;
  for (let i = startIndex + 1; i <= endIndex && i < lat.length && k < 0; i++) if (isFix(lat[i], lon[i])) k = i;
  if (k < 0) {
    const d = distanceFromHome?.[startIndex];
    return { lat: null, lon: null, distanceFromHomeM: d !== undefined && Number.isFinite(d) ? d : null };
  }
  const d = distanceFromHome?.[k];
  return { lat: lat[k], lon: lon[k], distanceFromHomeM: d !== undefined && Number.isFinite(d) ? d : null };
}

/** What an event adds to its span. */
export interface SpanEventFields {
  peak: number | null;
  threshold: number | null;
  detail?: Record<string, unknown>;
  distanceFromHome?: ArrayLike<number>;
}

/**
 * Builds an {@link AnalysisEvent} from a span: start/end time from the span, position from
 * {@link positionAt} at its start, and `detail.durationS` (s) added to the given detail.
 *
 * Cost: that of {@link positionAt}. Pure.
 *
 * @param kind event kind
 * @param span the samples the event covers
 * @param series the run (lat/lon read)
 * @param fields peak, threshold, detail and optional distance from home (m)
 * @returns the event
 * @example
 * spanEvent("link-fade", { startIndex: 0, endIndex: 4, startS: 0, endS: 0.5 }, series, { peak: 40, threshold: 70 });
 * // => { kind: "link-fade", startS: 0, endS: 0.5, peak: 40, threshold: 70, detail: { durationS: 0.5 }, ... }
 */
export function spanEvent(kind: EventKind, span: Span, series: Pick<RunSeries, "lat" | "lon">, fields: SpanEventFields): AnalysisEvent {
  const pos = positionAt(series, span.startIndex, span.endIndex, fields.distanceFromHome);
  return {
    kind,
    startS: span.startS,
    endS: span.endS,
    ...pos,
    peak: fields.peak,
    threshold: fields.threshold,
    detail: { durationS: span.endS - span.startS, ...fields.detail },
  };
}
