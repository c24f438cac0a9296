import { BatchBuilder, DEFAULT_BATCH_SIZE } from "./batch-builder";
import { EpochAssembler, epochSample, type Epoch } from "./nmea-epoch";
import { decodeNmeaSentence } from "./nmea-sentence";
import { NmeaTimeline } from "./nmea-timeline";
import { lines } from "./read-text";
import { ParseError, sampleFields, type BatchSink, type ByteSource, type ParseSummary, type ParseWarning } from "./types";
import { WarningLog } from "./warnings";

export interface NmeaParseOptions {
  onBatch: BatchSink;
  /** Samples per batch (default 8192). */
  batchSize?: number;
}

/** Where a line holds sentences: from each `$` or `!` to the next. */
const PIECES = /[$!][^$!]*/g;
/** Whitespace and control characters (NUL padding, stray CR) around a sentence. */
const EDGES = /^[\s\x00-\x1f\x7f]+|[\s\x00-\x1f\x7f]+$/g;

/**
 * Parses an NMEA 0183 log into the normalised sample stream, streaming line by line.
 *
 * One sample per fix epoch: GGA, RMC and VTG sentences of one epoch — every talker (GP, GL, GA, GB,
 * BD, GN…), however they interleave — are one sample (see {@link EpochAssembler} for which sentence
 * gives which field). fixType is GGA's own quality code (0 none, 1 GPS, 2 DGPS, 3 PPS, 4 RTK, 5 float
 * RTK, 6 estimated, 7 manual, 8 simulation); without GGA, RMC status A gives 1 and V gives 0. Speeds
 * are m/s (1 kn = 1852/3600 m/s), courses degrees true, altitude m. `tS` is seconds since the first
 * sample, continuous over hour and midnight roll-overs; `startedAt` comes from trusted RMC dates
 * only (see {@link NmeaTimeline}: dates before 2000 or years away are ignored), null for GGA-only logs.
 *
 * Damage never refuses the file while a usable sentence remains: junk lines, NUL bytes, binary,
 * sentences cut short or run together, wrong checksums and undecodable GGA/RMC/VTG are skipped and
 * counted in one "skipped-junk" warning (first line, count, and how many of each kind). Several
 * sentences on one line and text before a `$` are read. Lines starting with `#` are comments (as in
 * GPSD's capture files); other well-formed sentences (GSA, GSV, GLL, ZDA, TXT, proprietary $P…) and
 * GGA/RMC without a time or position (a receiver before its first fix) are passed over silently.
 * Other warnings: "bogus-date", "time-backwards" (kept in file order), "missing-time" (a position
 * without a time, skipped), "out-of-range". Cost O(lines); memory O(batch size).
 *
 * @param source the log as byte or text chunks (UTF-8)
 * @param opts batch sink and batch size
 * @returns the summary; samples went to `opts.onBatch` in order
 * @throws {ParseError} "No NMEA 0183 position sentences (GGA, RMC) found" when no sample results
 * @example
 * const s = await parseNmea(source, { onBatch: (batch) => store(batch) });
 * s.startedAt?.toISOString(); // => "2019-04-07T00:03:43.030Z" for GPSD's gp-320fw cold-boot capture
 */
export async function parseNmea(source: ByteSource, opts: NmeaParseOptions): Promise<ParseSummary> {
  const warnings = new WarningLog();
  const junk = new JunkCount();
  const timeline = new NmeaTimeline();
  const b = new BatchBuilder(false, opts.batchSize ?? DEFAULT_BATCH_SIZE);
  let count = 0;
  let prevT = NaN;
  let firstT = NaN;

  const emit = async (e: Epoch) => {
    const fx = epochSample(e);
    const t = timeline.place(e.tod, e.dateMs, e.rmc?.valid === true, e.dateLine);
    if (Number.isNaN(firstT)) firstT = t;
    if (t < prevT) warnings.add("time-backwards", `The time goes backwards at some sentences; the samples were kept in file order (first: line ${e.line})`, e.line);
    prevT = t;
    if (Math.abs(fx.lat) > 90 || Math.abs(fx.lon) > 180) {
      warnings.add("out-of-range", `Positions out of range were left empty (first: line ${e.line})`, e.line);
      fx.lat = fx.lon = NaN;
    }
    if (b.full) await opts.onBatch(b.take()!);
    b.begin(e.line);
    b.set("tS", t - firstT);
    for (const f of ["lat", "lon", "altM", "speedMps", "headingDeg", "sats", "hdop", "fixType"] as const) b.set(f, fx[f]);
    b.commit();
    count++;
  };
  const epochs = new EpochAssembler(emit);

  for await (const { text, line } of lines(source)) {
    const bare = text.replace(EDGES, "");
    if (bare === "" || bare.startsWith("#")) continue;
    const pieces = bare.match(PIECES);
    if (!pieces) {
      junk.add("not-nmea", line);
      continue;
    }
    for (const piece of pieces) {
      const s = decodeNmeaSentence(piece.replace(EDGES, ""));
      if (s.kind === "truncated" || s.kind === "bad-checksum" || s.kind === "unparsed") junk.add(s.kind, line);
      else if (s.kind === "vtg") epochs.addVtg(s);
      else if (s.kind === "gga" || s.kind === "rmc") {
        if (!Number.isNaN(s.tod)) await epochs.add(s, line);
        else if (!Number.isNaN(s.lat)) warnings.add("missing-time", `GGA/RMC sentences with a position but no time of day were skipped (first: line ${line})`, line);
      }
    }
  }
  await epochs.finish();
  if (count === 0) throw new ParseError("No NMEA 0183 position sentences (GGA, RMC) found", undefined, undefined, "GGA or RMC sentences");
  const last = b.take();
  if (last) await opts.onBatch(last);
  return {
    format: "nmea",
    sampleCount: count,
    startedAt: timeline.startedAt(firstT),
    modeNames: [],
    warnings: [junk.warning(), timeline.warning(), ...warnings.list()].filter((w): w is ParseWarning => w !== null),
    fieldsPresent: sampleFields.filter((f) => b.present.has(f)),
    hasRc: false,
  };
}

type JunkKind = "truncated" | "bad-checksum" | "unparsed" | "not-nmea";

/** Counts what was skipped as damage, by kind, for the one "skipped-junk" warning. */
class JunkCount {
  private byKind: Record<JunkKind, number> = { truncated: 0, "bad-checksum": 0, unparsed: 0, "not-nmea": 0 };
  private total = 0;
  private firstLine = 0;

  add(kind: JunkKind, line: number): void {
    if (this.total++ === 0) this.firstLine = line;
    this.byKind[kind]++;
  }

  warning(): ParseWarning | null {
    if (this.total === 0) return null;
    const words: Record<JunkKind, string> = {
      "bad-checksum": "with a wrong checksum",
      truncated: "cut short or run together (no checksum at the end)",
      unparsed: "malformed despite a valid checksum",
      "not-nmea": "of non-NMEA text (binary, NUL bytes, partial lines)",
    };
    const parts = (Object.keys(words) as JunkKind[])
      .filter((k) => this.byKind[k] > 0)
      .map((k) => `${this.byKind[k]} ${k === "not-nmea" ? "line" : "sentence"}${this.byKind[k] === 1 ? "" : "s"} ${words[k]}`);
    return { code: "skipped-junk", message: `Damaged or unreadable text was skipped: ${parts.join(", ")}`, line: this.firstLine, count: this.total };
  }
}
