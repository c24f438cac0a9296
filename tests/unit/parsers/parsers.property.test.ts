/**
 * Property-based tests (fast-check): random text, random bytes and well-formed CSV, GPX and NMEA
 * 0183 logs with random mutations go to each parser, to parseLog and to detectFormat + parseLog as
 * ingest does. Whatever the input, the outcome is one of two: a summary whose sampleCount equals
 * the samples delivered to onBatch, every value finite or NaN (lib/parsers/types.ts), or a
 * ParseError. Never another error type, never a run longer than fast-check's per-run `timeout`.
 * OWASP ASVS 4.0.3 V5.1.3/V5.1.4 (all input validated, failures reported as validation failures),
 * V12.1.1 (bounded work per file); xmldom entities: W3C XML 1.0 §4.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseCsv } from "@/lib/parsers/csv";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseGpx } from "@/lib/parsers/gpx";
import { parseNmea } from "@/lib/parsers/nmea";
import { parseLog } from "@/lib/parsers/parse-log";
import { ParseError, RC_CHANNELS, sampleFields, type ByteSource, type LogFormat, type ParseSummary, type SampleBatch } from "@/lib/parsers/types";
import { byteChunks, textChunks } from "../../helpers/byte-source";

/** ~200 runs per property; a single run over 3 s counts as a hang and fails the property. */
const RUNS: fc.Parameters<unknown> = { numRuns: 200, timeout: 3000, markInterruptAsFailure: true, interruptAfterTimeLimit: 60_000 };

type Parser = (source: ByteSource, onBatch: (b: SampleBatch) => void) => Promise<ParseSummary>;

const parsers: Record<string, Parser> = {
  parseCsv: (s, onBatch) => parseCsv(s, { onBatch, batchSize: 7 }),
  parseGpx: (s, onBatch) => parseGpx(s, { onBatch, batchSize: 7 }),
  "parseGpx (route fallback)": (s, onBatch) => parseGpx(s, { onBatch, batchSize: 7, fallbackToRoute: true }),
  parseNmea: (s, onBatch) => parseNmea(s, { onBatch, batchSize: 7 }),
  'parseLog("csv")': (s, onBatch) => parseLog("csv", s, { onBatch, batchSize: 7 }),
  'parseLog("gpx")': (s, onBatch) => parseLog("gpx", s, { onBatch, batchSize: 7 }),
  'parseLog("nmea")': (s, onBatch) => parseLog("nmea", s, { onBatch, batchSize: 7 }),
};

/**
 * Runs a parser and checks the contract; returns what happened. A non-ParseError rejection fails
 * the property (fast-check shrinks it to a small counter-example).
 */
async function outcome(parse: Parser, source: ByteSource): Promise<"samples" | "parse-error"> {
  let delivered = 0;
  const onBatch = (b: SampleBatch) => {
    expect(b.length).toBeGreaterThan(0);
    for (const f of sampleFields) {
      const col = b.columns[f];
      expect(col.length).toBe(b.length);
      for (let i = 0; i < b.length; i++) expect(Number.isFinite(col[i]) || Number.isNaN(col[i]), f).toBe(true);
    }
    expect(b.segmentStart.length).toBe(b.length);
    expect(b.sourceLine.length).toBe(b.length);
    if (b.rc) expect(b.rc.length).toBe(b.length * RC_CHANNELS);
    delivered += b.length;
  };
  let summary: ParseSummary;
  try {
    summary = await parse(source, onBatch);
  } catch (e) {
    if (!(e instanceof ParseError)) throw new Error(`expected a ParseError, got ${(e as Error)?.name}: ${(e as Error)?.message}`, { cause: e });
    expect(typeof e.describe()).toBe("string");
    expect(e.describe().length).toBeGreaterThan(0);
    return "parse-error";
  }
  expect(summary.sampleCount).toBe(delivered);
  expect(summary.sampleCount).toBeGreaterThan(0);
  for (const w of summary.warnings) expect(typeof w.code).toBe("string");
  return "samples";
}

/** As lib/ingest/ingest-run.ts: the head decides the format, then parseLog reads the whole input. */
const ingestLike =
  (fileName: string): Parser =>
  (source, onBatch) =>
    (async () => {
      const chunks: (Uint8Array | string)[] = [];
      for await (const c of source) chunks.push(c);
      const bytes = Buffer.concat(chunks.map((c) => (typeof c === "string" ? Buffer.from(c, "utf8") : Buffer.from(c))));
      const format: LogFormat = detectFormat(new TextDecoder().decode(bytes.subarray(0, 64 * 1024)), fileName);
      return parseLog(format, byteChunks(new Uint8Array(bytes), 13), { onBatch, batchSize: 7 });
    })();

const chunkSize = fc.integer({ min: 1, max: 64 });
const fileName = fc.constantFrom("log.csv", "log.gpx", "log.nmea", "log.txt", "log", "../../etc/passwd.csv");

// ---- generators for logs that are almost right -------------------------------------------------

const csvHeaders = fc.uniqueArray(
  fc.constantFrom("time", "time_s", "timestamp", "lat", "lon", "alt_m", "speed", "heading", "sats", "hdop", "fix", "rssi_dbm", "lq", "snr", "voltage_v", "current", "mah", "mode", "armed", "failsafe", "ch1", "rc2", "junk"),
  { minLength: 1, maxLength: 8 },
);
const csvCell = fc.oneof(
  fc.double({ noDefaultInfinity: false, noNaN: false }).map(String),
  fc.integer({ min: -2000, max: 2000 }).map(String),
  fc.constantFrom("", "NaN", "Infinity", "-Infinity", "1e400", "=HYPERLINK(\"x\")", "<script>alert(1)</script>", "MANUAL", "2026-11-14T10:00:00Z", "12:00:00", "\"", "\"a,b\"", "true", "1,5"),
  fc.string({ maxLength: 6 }),
);
const csvLog = fc
  .tuple(csvHeaders, fc.constantFrom(",", ";", "\t", "|"), fc.constantFrom("\n", "\r\n", "\r"), fc.integer({ min: 0, max: 12 }))
  .chain(([headers, d, nl, rows]) =>
    fc
      .array(fc.array(csvCell, { minLength: Math.max(0, headers.length - 1), maxLength: headers.length + 1 }), { minLength: rows, maxLength: rows })
      .map((body) => [headers.join(d), ...body.map((r) => r.join(d))].join(nl) + nl),
  );

const coord = fc.oneof(
  fc.double({ min: -200, max: 200, noNaN: true }).map(String),
  fc.constantFrom("", "NaN", "Infinity", "91", "-180.0", "45.0", "7.0", "abc", "&xxe;"),
);
const gpxTime = fc.oneof(
  fc.date({ min: new Date("1990-01-01T00:00:00Z"), max: new Date("2100-01-01T00:00:00Z"), noInvalidDate: true }).map((d) => d.toISOString()),
  fc.constantFrom("", "yesterday", "2026-13-40T99:99:99Z", "2026-11-14 10:00:00+01:00"),
);
const trkpt = fc
  .record({ lat: coord, lon: coord, ele: fc.option(csvCell), time: fc.option(gpxTime), tag: fc.constantFrom("trkpt", "rtept", "wpt") })
  .map(({ lat, lon, ele, time, tag }) => `<${tag} lat="${lat}" lon="${lon}">${ele === null ? "" : `<ele>${ele.replace(/[<&]/g, "")}</ele>`}${time === null ? "" : `<time>${time}</time>`}</${tag}>`);
const gpxLog = fc
  .record({
    doctype: fc.constantFrom(
      "",
      '<!DOCTYPE gpx [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>',
      '<!DOCTYPE gpx [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;">]>',
    ),
    ns: fc.constantFrom(' xmlns="http://www.topografix.com/GPX/1/1"', ' xmlns="http://www.topografix.com/GPX/1/0"', ""),
    segs: fc.array(fc.array(trkpt, { maxLength: 6 }), { maxLength: 3 }),
    entityRef: fc.constantFrom("", "&xxe;", "&c;"),
  })
  .map(
    ({ doctype, ns, segs, entityRef }) =>
      `<?xml version="1.0" encoding="UTF-8"?>\n${doctype}\n<gpx version="1.1" creator="p"${ns}>\n<trk><name>${entityRef}</name>\n${segs.map((s) => `<trkseg>\n${s.join("\n")}\n</trkseg>`).join("\n")}\n</trk>\n</gpx>\n`,
  );

function nmeaChecksum(body: string): string {
  let c = 0;
  for (let i = 0; i < body.length; i++) c ^= body.charCodeAt(i);
  return c.toString(16).toUpperCase().padStart(2, "0");
}
const nmeaField = fc.oneof(fc.integer({ min: 0, max: 999999 }).map(String), fc.constantFrom("", "N", "S", "E", "W", "A", "V", "M", "4807.038", "01131.000", "9999.999", "-1", "x"));
const hhmmss = fc.tuple(fc.integer({ min: 0, max: 25 }), fc.integer({ min: 0, max: 61 }), fc.integer({ min: 0, max: 61 })).map((t) => t.map((n) => String(n).padStart(2, "0")).join(""));
const nmeaSentence = fc
  .tuple(
    fc.constantFrom("GPGGA", "GNGGA", "GPRMC", "GNRMC", "GPVTG", "GPGSA", "PUBX", "XXXXX"),
    hhmmss,
    fc.array(nmeaField, { minLength: 0, maxLength: 14 }),
    fc.constantFrom("good", "bad", "none"),
  )
  .map(([id, tod, fields, sum]) => {
    const body = [id, tod, ...fields].join(",");
    const cs = nmeaChecksum(body);
    return `$${body}${sum === "none" ? "" : `*${sum === "good" ? cs : (parseInt(cs, 16) ^ 0x21).toString(16).toUpperCase().padStart(2, "0")}`}`;
  });
const nmeaLog = fc.tuple(fc.array(nmeaSentence, { minLength: 0, maxLength: 20 }), fc.constantFrom("\r\n", "\n", "\r")).map(([s, nl]) => s.join(nl) + nl);

/** Cuts, duplicates and inserts junk at random places: structured input made slightly wrong. */
const mutated = (base: fc.Arbitrary<string>) =>
  fc
    .tuple(
      base,
      fc.array(
        fc.record({
          at: fc.nat(),
          kind: fc.constantFrom("delete", "insert", "duplicate"),
          len: fc.integer({ min: 1, max: 12 }),
          junk: fc.oneof(fc.string({ maxLength: 8, unit: "binary" }), fc.constantFrom("\u0000", "\"", "<", ">", "&", "]]>", "\r", "\n", ",", "*", "$", "\uFFFD", "<!--", "<![CDATA[")),
        }),
        { maxLength: 4 },
      ),
    )
    .map(([text, edits]) => {
      let s = text;
      for (const e of edits) {
        const at = s.length ? e.at % s.length : 0;
        if (e.kind === "delete") s = s.slice(0, at) + s.slice(at + e.len);
        else if (e.kind === "insert") s = s.slice(0, at) + e.junk + s.slice(at);
        else s = s.slice(0, at) + s.slice(at, at + e.len) + s.slice(at);
      }
      return s;
    });

// ---- properties ----------------------------------------------------------------------------------

describe("every parser on random input: samples that add up, or a ParseError", () => {
  for (const [name, parse] of Object.entries(parsers)) {
    it(`${name}: random text`, async () => {
      // ASVS V5.1.4: no input makes a parser fail with anything but a validation error
      await fc.assert(fc.asyncProperty(fc.string({ maxLength: 300, unit: "binary" }), chunkSize, async (s, n) => void (await outcome(parse, textChunks(s, n)))), RUNS);
    });

    it(`${name}: random bytes`, async () => {
      // ASVS V12.2.1: bytes that are not UTF-8 text
      await fc.assert(fc.asyncProperty(fc.uint8Array({ maxLength: 400 }), chunkSize, async (b, n) => void (await outcome(parse, byteChunks(b, n)))), RUNS);
    });
  }
});

describe("structured logs with mutations", () => {
  it("CSV: parseCsv and detectFormat + parseLog", async () => {
    // ASVS V5.1.3 / V5.1.4; OWASP "CSV Injection" cells ride along as data
    let accepted = 0;
    await fc.assert(
      fc.asyncProperty(mutated(csvLog), chunkSize, fileName, async (s, n, f) => {
        if ((await outcome(parsers.parseCsv, byteChunks(s, n))) === "samples") accepted++;
        await outcome(ingestLike(f), textChunks(s, n));
      }),
      RUNS,
    );
    // The generator is not so broken that nothing is ever accepted (the property would be empty).
    expect(accepted).toBeGreaterThan(0);
  });

  it("GPX (with DTDs and entity references): parseGpx and detectFormat + parseLog", async () => {
    // ASVS V5.5.2, W3C XML 1.0 §4: entities are never expanded, so output stays small
    let accepted = 0;
    await fc.assert(
      fc.asyncProperty(mutated(gpxLog), chunkSize, fileName, async (s, n, f) => {
        if ((await outcome(parsers.parseGpx, byteChunks(s, n))) === "samples") accepted++;
        await outcome(parsers["parseGpx (route fallback)"], byteChunks(s, n));
        await outcome(ingestLike(f), byteChunks(s, n));
      }),
      RUNS,
    );
    expect(accepted).toBeGreaterThan(0);
  });

  it("NMEA 0183 (good, bad and missing checksums): parseNmea and detectFormat + parseLog", async () => {
    // ASVS V5.1.4 (checksums checked, bad sentences skipped with a warning)
    let accepted = 0;
    await fc.assert(
      fc.asyncProperty(mutated(nmeaLog), chunkSize, fileName, async (s, n, f) => {
        if ((await outcome(parsers.parseNmea, byteChunks(s, n))) === "samples") accepted++;
        await outcome(ingestLike(f), byteChunks(s, n));
      }),
      RUNS,
    );
    expect(accepted).toBeGreaterThan(0);
  });

  it("detectFormat on random text returns a format or throws a ParseError", () => {
    // ASVS V12.2.1
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 300, unit: "binary" }), mutated(csvLog), mutated(gpxLog), mutated(nmeaLog)), fileName, (s, f) => {
        try {
          expect(["csv", "gpx", "nmea"]).toContain(detectFormat(s, f));
        } catch (e) {
          if (!(e instanceof ParseError)) throw e;
        }
      }),
      { numRuns: 400 },
    );
  });
});
