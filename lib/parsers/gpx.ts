import type { Element } from "@xmldom/xmldom";
import { BatchBuilder, DEFAULT_BATCH_SIZE } from "./batch-builder";
import { childElements, childText, parseGpxTime, pointCoordinates, readGpxDocument } from "./gpx-dom";
import { readPointFields } from "./gpx-point";
import { readAllText } from "./read-text";
import { ParseError, sampleFields, type BatchSink, type ByteSource, type ParseSummary } from "./types";
import { NO_TIMES, WarningLog } from "./warnings";

export { parseGpxRoutePlan, type GpxRoutePlan } from "./gpx-route-plan";

/** Largest GPX accepted: the whole document is held in memory as text and as a DOM. */
export const DEFAULT_GPX_MAX_BYTES = 256 * 1024 * 1024;

export interface GpxParseOptions {
  onBatch: BatchSink;
  /** Samples per batch (default 8192). */
  batchSize?: number;
  /** Input size limit in bytes (default 256 MB). */
  maxBytes?: number;
  /**
   * When true, a file without track points is read from its routes (each <rte> a segment) or,
   * failing that, its waypoint list, instead of throwing. Default false.
   */
  fallbackToRoute?: boolean;
}

/**
 * Parses a GPX 1.0 or 1.1 track into the normalised sample stream, one sample per <trkpt>.
 *
 * Every <trkseg> (and so every <trk>) starts a new segment: its first sample after the first one
 * of the log gets `segmentStart = 1`, a reception gap that is never bridged; the first sample of
 * every <trk> after the first also gets `trackStart = 1` (a new recording). `tS` is seconds since
 * the first time in the log (fractional seconds and zone offsets kept). A point without <time>
 * keeps its position and takes the previous sample's `tS` (never interpolated; warning
 * "missing-time"). When the times are not usable (see {@link judgeTiming}: none, fewer than half
 * the points, or one placeholder stamp on all), `tS` is the sample index in seconds, the run has
 * no start time, and one "no-times" warning says why: the analysis then gives no time figures.
 * Times that go backwards are kept ("time-backwards"). Points with missing or out-of-range lat/lon
 * are skipped ("out-of-range"). Per point: <ele> → altM (m), <sat> → sats, <hdop> → hdop,
 * <fix> → fixType (see GPX_FIX_TYPES), GPX 1.0 <speed> (m/s) → speedMps, <course> (°) → headingDeg.
 * `sourceLine` holds the 1-based number of the point in the file. Cost O(points); the whole text
 * and DOM are held in memory.
 *
 * @param source the file as byte or text chunks (UTF-8)
 * @param opts batch sink, batch size, size limit, route fallback
 * @returns the summary; samples went to `opts.onBatch` in order
 * @throws {ParseError} when larger than `maxBytes`, not well-formed XML (with line and column), the
 *   root is not <gpx>, there are no track points (a route/waypoint-only file gets its own message),
 *   or no point has valid coordinates
 * @example
 * // georust/gpx tests/fixtures/garmin-activity.gpx: one track of 988 points
 * const summary = await parseGpx(source, { onBatch: (batch) => store(batch) });
 * summary.sampleCount; // => 988
 */
export async function parseGpx(source: ByteSource, opts: GpxParseOptions): Promise<ParseSummary> {
  const text = await readAllText(source, opts.maxBytes ?? DEFAULT_GPX_MAX_BYTES, "GPX");
  const warnings = new WarningLog();
  const { root, ns } = readGpxDocument(text, warnings);
  const segments = pointSegments(root, ns, opts.fallbackToRoute ?? false);
  const timing = judgeTiming(segments, ns);
  const hasTimes = timing.usable;

  const b = new BatchBuilder(false, opts.batchSize ?? DEFAULT_BATCH_SIZE);
  let pointNo = 0;
  let count = 0;
  let t0 = NaN; // epoch ms of the first time in the log
  let prevMs = NaN;
  let prevTs = 0;
  for (const seg of segments) {
    let startsSegment = count > 0;
    let startsTrack = count > 0 && seg.firstOfTrack;
    for (const p of seg.points) {
      pointNo++;
      const c = pointCoordinates(p);
      if (!c) {
        warnings.add("out-of-range", `Points with a missing or out-of-range latitude/longitude were skipped (first: point ${pointNo})`, p.lineNumber);
        continue;
      }
      const timeText = childText(p, "time", ns);
      const ms = parseGpxTime(timeText);
      if (timeText && Number.isNaN(ms) && hasTimes) {
        warnings.add("bad-value", `Some <time> values are not ISO 8601 times and were treated as missing (first: point ${pointNo}, ${JSON.stringify(timeText.slice(0, 40))})`, p.lineNumber, "time");
      }
      let tS: number;
      if (!hasTimes) tS = count;
      else if (Number.isNaN(ms)) {
        warnings.add("missing-time", `Points without a time were given the time of the sample before them, not interpolated (first: point ${pointNo})`, p.lineNumber);
        tS = prevTs;
      } else {
        if (Number.isNaN(t0)) t0 = ms;
        if (ms < prevMs) warnings.add("time-backwards", `The time goes backwards at some points; they were kept in file order (first: point ${pointNo})`, p.lineNumber);
        prevMs = ms;
        tS = prevTs = (ms - t0) / 1000;
      }
      if (b.full) await opts.onBatch(b.take()!);
      b.begin(pointNo, startsSegment, startsTrack);
      startsSegment = startsTrack = false;
      b.set("tS", tS);
      b.set("lat", c.lat);
      b.set("lon", c.lon);
      readPointFields(p, ns, b, warnings, pointNo);
      b.commit();
      count++;
    }
  }
  if (count === 0) {
    throw new ParseError("The GPX file contains no track points with valid coordinates", undefined, undefined, "lat within ±90 and lon within ±180");
  }
  if (!hasTimes) warnings.add(NO_TIMES, timing.why);
  const last = b.take();
  if (last) await opts.onBatch(last);
  return {
    format: "gpx",
    sampleCount: count,
    startedAt: Number.isNaN(t0) ? null : new Date(Math.floor(t0)),
    modeNames: [],
    warnings: warnings.list(),
    fieldsPresent: sampleFields.filter((f) => b.present.has(f)),
    hasRc: false,
  };
}

/** Share of points that must carry a time for the times to date and pace the track. */
export const MIN_TIMED_SHARE = 0.5;

/**
 * Whether a track's times can pace it: at least {@link MIN_TIMED_SHARE} of the points with valid
 * coordinates carry a time, and those times are not one placeholder stamped on every point (with
 * three or more timed points, the median step between consecutive ones is above zero). A track whose four timed points of
 * 588 are out of order, or whose every point says 1901-12-13T20:45:52Z, has geometry but no clock.
 */
export function judgeTiming(segments: PointSegment[], ns: string | null): { usable: boolean; why: string } {
  let points = 0;
  const times: number[] = [];
  for (const seg of segments)
    for (const p of seg.points) {
      if (!pointCoordinates(p)) continue;
      points++;
      const ms = parseGpxTime(childText(p, "time", ns));
      if (!Number.isNaN(ms)) times.push(ms);
    }
  const spaced = "time-based figures are not available; samples are numbered one second apart";
  if (times.length === 0) return { usable: false, why: `The track has no timestamps: ${spaced}` };
  if (times.length < MIN_TIMED_SHARE * points)
    return { usable: false, why: `Only ${times.length} of ${points} points have a time: ${spaced}` };
  const steps = times.slice(1).map((t, i) => Math.abs(t - times[i])).sort((a, b) => a - b);
  if (times.length >= 3 && steps[Math.floor(steps.length / 2)] === 0)
    return { usable: false, why: `The points carry one placeholder time (${new Date(Math.floor(times[0])).toISOString()}), not a clock: ${spaced}` };
  return { usable: true, why: "" };
}

/** One point list to read: a <trkseg> (or a route / the waypoint list), and whether it opens a <trk>. */
interface PointSegment {
  points: Element[];
  /** True for the first non-empty segment of each <trk>: a new recording starts there. */
  firstOfTrack: boolean;
}

/** The point lists to read, one per segment: every <trkseg>, or the route/waypoint fallback. */
function pointSegments(root: Element, ns: string | null, fallbackToRoute: boolean): PointSegment[] {
  const segments: PointSegment[] = [];
  for (const trk of childElements(root, "trk", ns)) {
    let first = true;
    for (const seg of childElements(trk, "trkseg", ns)) {
      const points = childElements(seg, "trkpt", ns);
      segments.push({ points, firstOfTrack: first && points.length > 0 });
      if (points.length > 0) first = false;
    }
  }
  if (segments.some((s) => s.points.length > 0)) return segments;

  const routes = childElements(root, "rte", ns)
    .map((rte) => childElements(rte, "rtept", ns))
    .filter((pts) => pts.length > 0);
  const waypoints = childElements(root, "wpt", ns);
  if (fallbackToRoute && routes.length > 0) return routes.map((points) => ({ points, firstOfTrack: false }));
  if (fallbackToRoute && waypoints.length > 0) return [{ points: waypoints, firstOfTrack: false }];
  if (routes.length > 0 || waypoints.length > 0) {
    throw new ParseError(
      "The GPX file has no track points; a GPX route or waypoint list can be added as a route plan instead",
      undefined,
      undefined,
      "at least one <trkpt>",
    );
  }
  throw new ParseError("The GPX file contains no track points", undefined, undefined, "at least one <trkpt>");
}
