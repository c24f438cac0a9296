import { BatchBuilder, DEFAULT_BATCH_SIZE } from "./batch-builder";
import { decodeNmeaSentence, type NmeaSentence } from "./nmea-sentence";
import { lines } from "./read-text";
import { ParseError, sampleFields, type BatchSink, type ByteSource, type ParseSummary } from "./types";
import { WarningLog } from "./warnings";

const DAY_S = 86_400;
const DAY_MS = DAY_S * 1000;

export interface NmeaParseOptions {
  onBatch: BatchSink;
  /** Samples per batch (default 8192). */
  batchSize?: number;
}

/** One sample being assembled from the sentences that share a fix time. */
interface Fix {
  line: number;
  tod: number;
  dateMs: number | null;
  lat: number;
  lon: number;
  altM: number;
  sats: number;
  hdop: number;
  quality: number;
  rmcValid: boolean | null;
  speedMps: number;
  headingDeg: number;
}

type Motion = Extract<NmeaSentence, { kind: "vtg" }>;

/**
 * Parses an NMEA 0183 log into the normalised sample stream, streaming line by line.
 *
 * GGA and RMC sentences with the same time of day (hhmmss.ss) become one sample; VTG (which has
 * no time) is merged into the sample being assembled, or into the next one when none has started.
 * The first value of a field in a sample wins. fixType is GGA's own quality code (0 none, 1 GPS,
 * 2 DGPS, 3 PPS, 4 RTK, 5 float RTK, 6 estimated, 7 manual, 8 simulation); without GGA, RMC status A
 * gives 1 and V gives 0. Speeds are m/s (1 kn = 1852/3600 m/s), courses degrees true, altitude m.
 * `tS` is seconds since the first sample. The date comes from RMC; with GGA only, `startedAt` is
 * null. When the time of day falls back by more than 12 h and no RMC date says otherwise, a day is
 * added (midnight roll-over). Several sentences on one line and junk before `$` are tolerated.
 *
 * Warnings (aggregated, first line kept): "bad-checksum" (missing or wrong checksum, sentence
 * skipped), "unparsed-sentence" (not a sentence nmea-simple can decode), "missing-time" (GGA/RMC
 * without a time, skipped), "time-backwards", "out-of-range". Other decodable sentences (GSA, GSV…)
 * are ignored silently. Cost O(lines); memory O(batch size).
 *
 * @param source the log as byte or text chunks (UTF-8)
 * @param opts batch sink and batch size
 * @returns the summary; samples went to `opts.onBatch` in order
 * @throws {ParseError} "No NMEA 0183 position sentences (GGA, RMC) found" when no sample results
 * @example
 * const s = await parseNmea(source, { onBatch: (batch) => store(batch) });
 * s.startedAt?.toISOString(); // => "1994-03-23T12:35:19.000Z" for the DePriest RMC example
 */
export async function parseNmea(source: ByteSource, opts: NmeaParseOptions): Promise<ParseSummary> {
  const warnings = new WarningLog();
  const b = new BatchBuilder(false, opts.batchSize ?? DEFAULT_BATCH_SIZE);
  let current: Fix | null = null;
  let pendingMotion: Motion | null = null;
  let count = 0;
  // Continuous timeline: t = dayIndex × 86400 + time of day; day0Ms is the UTC midnight of day 0.
  let dayIndex = 0;
  let day0Ms: number | null = null;
  let prevTod = NaN;
  let prevT = NaN;
  let firstT = NaN;

  const flush = async (fx: Fix) => {
    if (fx.dateMs !== null && day0Ms !== null) dayIndex = Math.round((fx.dateMs - day0Ms) / DAY_MS);
    else if (fx.tod < prevTod - DAY_S / 2) dayIndex++; // NaN prevTod compares false
    if (fx.dateMs !== null && day0Ms === null) day0Ms = fx.dateMs - dayIndex * DAY_MS;
    const t = dayIndex * DAY_S + fx.tod;
    if (Number.isNaN(firstT)) firstT = t;
    if (t < prevT) warnings.add("time-backwards", `The time goes backwards at some sentences; the samples were kept (first: line ${fx.line})`, fx.line);
    prevT = t;
    prevTod = fx.tod;
    if (Math.abs(fx.lat) > 90 || Math.abs(fx.lon) > 180) {
      warnings.add("out-of-range", `Positions out of range were left empty (first: line ${fx.line})`, fx.line);
      fx.lat = fx.lon = NaN;
    }
    if (b.full) await opts.onBatch(b.take()!);
    b.begin(fx.line);
    b.set("tS", t - firstT);
    b.set("lat", fx.lat);
    b.set("lon", fx.lon);
    b.set("altM", fx.altM);
    b.set("speedMps", fx.speedMps);
    b.set("headingDeg", fx.headingDeg);
    b.set("sats", fx.sats);
    b.set("hdop", fx.hdop);
    b.set("fixType", !Number.isNaN(fx.quality) ? fx.quality : fx.rmcValid === null ? NaN : fx.rmcValid ? 1 : 0);
    b.commit();
    count++;
  };

  for await (const { text, line } of lines(source)) {
    const pieces = text.match(/[$!][^$!]*/g);
    if (!pieces) {
      if (text.trim() !== "") warnings.add("unparsed-sentence", `Lines that are not NMEA sentences were skipped (first: line ${line})`, line);
      continue;
    }
    for (const piece of pieces) {
      const s = decodeNmeaSentence(piece.trim());
      if (s.kind === "bad-checksum") {
        warnings.add("bad-checksum", `Sentences with a missing or wrong checksum were skipped (first: line ${line})`, line);
      } else if (s.kind === "unparsed") {
        warnings.add("unparsed-sentence", `Sentences that could not be decoded were skipped (first: line ${line})`, line);
      } else if (s.kind === "vtg") {
        if (current) mergeMotion(current, s);
        else pendingMotion = s;
      } else if (s.kind === "gga" || s.kind === "rmc") {
        if (Number.isNaN(s.tod)) {
          warnings.add("missing-time", `GGA/RMC sentences without a time of day were skipped (first: line ${line})`, line);
          continue;
        }
        if (!current || current.tod !== s.tod) {
          if (current) await flush(current);
          current = emptyFix(line, s.tod);
          if (pendingMotion) mergeMotion(current, pendingMotion);
          pendingMotion = null;
        }
        mergeFix(current, s);
      }
    }
  }
  if (current) await flush(current);
  if (count === 0) throw new ParseError("No NMEA 0183 position sentences (GGA, RMC) found", undefined, undefined, "GGA or RMC sentences");
  const last = b.take();
  if (last) await opts.onBatch(last);
  return {
    format: "nmea",
    sampleCount: count,
    startedAt: day0Ms === null ? null : new Date(Math.round(day0Ms + firstT * 1000)),
    modeNames: [],
    warnings: warnings.list(),
    fieldsPresent: sampleFields.filter((f) => b.present.has(f)),
    hasRc: false,
  };
}

function emptyFix(line: number, tod: number): Fix {
  return {
    line, tod, dateMs: null, lat: NaN, lon: NaN, altM: NaN, sats: NaN, hdop: NaN,
    quality: NaN, rmcValid: null, speedMps: NaN, headingDeg: NaN,
  };
}

/** Fills fields of `fx` that are still empty; the first sentence with a value wins. */
function mergeFix(fx: Fix, s: Extract<NmeaSentence, { kind: "gga" | "rmc" }>): void {
  const fill = (key: "lat" | "lon" | "altM" | "sats" | "hdop" | "quality" | "speedMps" | "headingDeg", v: number) => {
    if (Number.isNaN(fx[key])) fx[key] = v;
  };
  // Take lat and lon together so a sample never mixes two sentences' positions.
  if (Number.isNaN(fx.lat) && !Number.isNaN(s.lat) && !Number.isNaN(s.lon)) {
    fx.lat = s.lat;
    fx.lon = s.lon;
  }
  if (s.kind === "gga") {
    fill("altM", s.altM);
    fill("sats", s.sats);
    fill("hdop", s.hdop);
    fill("quality", s.quality);
  } else {
    fx.dateMs ??= s.dateMs;
    fx.rmcValid ??= s.valid;
    fill("speedMps", s.speedMps);
    fill("headingDeg", s.headingDeg);
  }
}

function mergeMotion(fx: Fix, m: Motion): void {
  if (Number.isNaN(fx.speedMps)) fx.speedMps = m.speedMps;
  if (Number.isNaN(fx.headingDeg)) fx.headingDeg = m.headingDeg;
}
