import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseErrorOfAsync } from "@/tests/helpers/parse-errors";
import type { ColumnMap } from "@/lib/parsers/column-map";
import { parseCsv } from "@/lib/parsers/csv";
import { RC_CHANNELS, sampleFields, type ByteSource, type SampleBatch } from "@/lib/parsers/types";
import { byteChunks, chunksOf, collectSamples, textChunks } from "@/tests/helpers/byte-source";

const FIXTURES = path.resolve(process.cwd(), "tests/fixtures/csv");
const fixture = (file: string) => new Uint8Array(fs.readFileSync(path.join(FIXTURES, file)));

async function run(input: string | Uint8Array, opts: { columnMap?: ColumnMap; batchSize?: number } = {}, chunk = 4096) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseCsv(byteChunks(input, chunk), { onBatch, ...opts });
  return { summary, s: samples.columns, samples };
}
const errorOf = parseErrorOfAsync;
const warningOf = (summary: { warnings: { code: string }[] }, code: string) => summary.warnings.find((w) => w.code === code);

/**
 * A semicolon log with BOM, CRLF, comma decimals, blank lines, multi-byte text and quoted modes
 * holding the delimiter, doubled quotes and a CRLF, long enough to run past the 64 KB sniff.
 */
function longSemicolonLog(rows: number): string {
  const modes = ["Höhenhalt µ", '"say ""hi""; twice"', '"TWO\r\nLINES"'];
  const out = ["\uFEFFTime (s);Lat;Lon;Volt;Mode;Note"];
  for (let i = 0; i < rows; i++) {
    const t = (i / 10).toFixed(1).replace(".", ",");
    out.push(`${t};48,1375;11,5750;12,5;${modes[i % 3]};${"Zeile ".repeat(8)}${i}`);
    if (i % 100 === 99) out.push("");
  }
  return out.join("\r\n") + "\r\n";
}

/** Plain copies of each batch, in order, so two runs can be compared batch by batch. */
async function batchesOf(source: ByteSource, batchSize: number) {
  const out: unknown[] = [];
  await parseCsv(source, {
    batchSize,
    onBatch: (b: SampleBatch) => {
      const columns = Object.fromEntries(sampleFields.map((f) => [f, Array.from(b.columns[f])]));
      out.push({ length: b.length, columns, rc: b.rc && Array.from(b.rc), seg: Array.from(b.segmentStart), line: Array.from(b.sourceLine) });
    },
  });
  return out;
}

describe("parseCsv", () => {
  it("reads the log simulator's file into samples in the units of types.ts", async () => {
    const { summary, s, samples } = await run(fixture("simulator.csv"));
    expect(summary).toMatchObject({ format: "csv", sampleCount: 10, startedAt: null, hasRc: true, unplaced: [] });
    expect(summary.warnings).toEqual([]);
    expect(summary.modeNames).toEqual(["MANUAL", "AUTO", "RTH"]);
    expect(summary.fieldsPresent).toEqual(sampleFields.filter((f) => f !== "rssiPct"));
    expect(s.tS).toEqual([0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5]);
    expect(s.lat[2]).toBe(51.50121);
    expect(s.lon[2]).toBe(-0.14208);
    expect(s.rssiDbm.slice(6, 9)).toEqual([-78, -97, -105]);
    expect(s.lqPct[8]).toBe(0);
    expect(s.snrDb[8]).toBe(-11);
    expect(s.modeIndex).toEqual([0, 0, 0, 1, 1, 1, 1, 1, 2, 2]);
    expect(s.armed.slice(0, 2)).toEqual([0, 1]);
    expect(s.failsafe.slice(6, 10)).toEqual([0, 1, 1, 0]);
    expect(s.fixType[0]).toBe(3);
    expect(samples.rc![2].slice(0, 8)).toEqual([1520, 1500, 1400, 1500, 2000, 1000, 1500, 1500]);
    expect(samples.rc![2].slice(8)).toEqual(new Array(RC_CHANNELS - 8).fill(0));
    expect(samples.sourceLine).toEqual([2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
    expect(samples.segmentStart).toEqual([1, 0, 0, 0, 0, 0, 0, 0, 0, 0]);
    expect(summary.columnMap.delimiter).toBe(",");
    expect(summary.columnMap.columns[0]).toEqual({ header: "time_s", field: "time", unit: "s" });
  });

  it("gives the same batches for 7-byte chunks as for one chunk", async () => {
    for (const file of ["simulator.csv", "semicolon-comma-bom-crlf.csv", "quoted.csv", "clock-midnight.csv"]) {
      const bytes = fixture(file);
      const whole = await batchesOf(chunksOf(bytes), 3);
      expect(whole.length, file).toBeGreaterThan(0);
      expect(await batchesOf(byteChunks(bytes, 7), 3), file).toEqual(whole);
      expect(await batchesOf(textChunks(new TextDecoder().decode(bytes), 7), 3), file).toEqual(whole);
    }
  });

  it("gives the same batches for 7-byte chunks as for one chunk past the first 64 KB", async () => {
    const text = longSemicolonLog(3000);
    expect(text.length).toBeGreaterThan(3 * 64 * 1024);
    const bytes = new TextEncoder().encode(text);
    const whole = await batchesOf(chunksOf(bytes), 1000);
    expect(whole).toHaveLength(3);
    expect(await batchesOf(byteChunks(bytes, 7), 1000)).toEqual(whole);
    expect(await batchesOf(textChunks(text, 7), 1000)).toEqual(whole);
  });

  it("keeps file lines, quoted line breaks and multi-byte text right past the first 64 KB", async () => {
    const { summary, s, samples } = await run(longSemicolonLog(3000), {}, 7);
    expect(summary.sampleCount).toBe(3000);
    expect(summary.warnings).toEqual([]);
    expect(summary.modeNames).toEqual(["Höhenhalt µ", 'say "hi"; twice', "TWO\r\nLINES"]);
    // Header on line 1; every 100th row is followed by a blank line; mode 2 spans two lines.
    const expectedLine: number[] = [];
    for (let i = 0, line = 2; i < 3000; i++) {
      expectedLine.push(line);
      line += (i % 3 === 2 ? 2 : 1) + (i % 100 === 99 ? 1 : 0);
    }
    expect(samples.sourceLine).toEqual(expectedLine);
    expect(s.tS[2999]).toBeCloseTo(299.9, 9);
    expect(s.voltageV[2999]).toBe(12.5);
  });

  it("reads a semicolon file with comma decimals, a BOM and CRLF line breaks", async () => {
    const { summary, s, samples } = await run(fixture("semicolon-comma-bom-crlf.csv"));
    expect(summary.columnMap).toMatchObject({ delimiter: ";", decimal: "," });
    expect(s.tS).toEqual([0, 0.5, 1]);
    expect(s.lat[0]).toBe(48.1375);
    expect(s.voltageV).toEqual([12.5, 12.4, 12.3]);
    expect(s.rssiPct).toEqual([100, 98, 95]);
    // 1 ft = 0.3048 m (1959 agreement; NIST SP 811 App. B); 36 km/h = 10 m/s.
    expect(s.altM[0]).toBeCloseTo(304.8, 9);
    expect(s.speedMps[0]).toBeCloseTo(10, 12);
    expect(summary.modeNames).toEqual(["Höhenhalt", "Rückkehr µ"]);
    expect(samples.sourceLine).toEqual([2, 3, 4]);
  });

  it("reads quoted fields and counts a line break inside quotes as a file line", async () => {
    const { summary, s, samples } = await run(fixture("quoted.csv"));
    expect(summary.modeNames).toEqual(["LOITER", "POS, HOLD", 'say "hi"', "TWO\nLINES"]);
    expect(s.modeIndex).toEqual([0, 1, 2, 3, 0]);
    expect(samples.sourceLine).toEqual([2, 3, 4, 5, 7]);
    expect(summary.unplaced).toEqual(["note"]);
  });

  it("passes formula-looking mode names through as plain text", async () => {
    const { summary, s } = await run(fixture("formula-mode.csv"));
    expect(summary.modeNames).toEqual(["=cmd|' /C calc'!A0", "+SUM(1,2)", "@import", "-2+3"]);
    expect(s.modeIndex).toEqual([0, 1, 2, 3, 0]);
    expect(s.rssiDbm).toEqual([-60, -61, -62, -63, -64]);
  });

  // ISO 8601-1:2019 §4.3.8 / RFC 3339 §5.6: 12:00+02:00 is 10:00Z, 05:30-04:30 is 10:00Z.
  it("reads ISO 8601 times with offsets and fractional seconds onto one time line", async () => {
    const { summary, s } = await run(fixture("iso-offset.csv"));
    expect(summary.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
    expect(s.tS.map((t) => Math.round(t * 1e9) / 1e9)).toEqual([0, 0.25, 1.1, 2.5, 3]);
    expect(summary.columnMap.columns[0]).toEqual({ header: "timestamp", field: "time", unit: "iso" });
    expect(warningOf(summary, "time-no-offset")).toBeUndefined();
  });

  it("warns when ISO times carry no offset and reads them as UTC", async () => {
    const { summary } = await run("time,v\n2024-05-01T10:00:00,1\n2024-05-01T10:00:01,2\n");
    expect(summary.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
    expect(warningOf(summary, "time-no-offset")).toMatchObject({ column: "time" });
  });

  it("keeps counting clock times across midnight", async () => {
    const { summary, s } = await run(fixture("clock-midnight.csv"));
    expect(s.tS).toEqual([0, 1, 2, 2.75]);
    expect(summary.warnings).toEqual([]);
    expect(summary.startedAt).toBeNull();
  });

  it("reads milliseconds and RSSI from a PWM channel as 0–100 %", async () => {
    const { summary, s, samples } = await run(fixture("pwm-rssi.csv"));
    expect(s.tS).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(s.rssiPct).toEqual([0, 0, 50, 75, 100, 100]);
    expect(s.rssiDbm.every(Number.isNaN)).toBe(true);
    expect(samples.rc![0].slice(0, 2)).toEqual([1500, 1500]);
    expect(summary.fieldsPresent).toEqual(["tS", "rssiPct"]);
  });

  it("converts feet to metres and km/h to m/s", async () => {
    const { s } = await run(fixture("kmh-feet.csv"));
    // 1 ft = 0.3048 m exactly (International Yard and Pound Agreement 1959; NIST SP 811 App. B).
    expect(s.altM[1]).toBeCloseTo(30.48, 12);
    expect(s.altM[3]).toBeCloseTo(1000.000032, 6);
    expect(s.speedMps.slice(1)).toEqual([10, 25, 100 / 3.6]);
  });

  it("converts knots, mph and milliamperes by their definitions", async () => {
    const map: ColumnMap = {
      columns: [
        { header: "t", field: "time", unit: "s" },
        { header: "v", field: "speed", unit: "kn" },
        { header: "i", field: "current", unit: "mA" },
        { header: "h", field: "alt", unit: "ft" },
      ],
    };
    const kn = await run("t,v,i,h\n0,1,1500,1\n1,3600,250,-10\n", { columnMap: map });
    // 1 kn = 1852 m/h (BIPM SI Brochure, 9th ed., Table 8).
    expect(kn.s.speedMps[0]).toBeCloseTo(1852 / 3600, 12);
    expect(kn.s.speedMps[1]).toBeCloseTo(1852, 9);
    expect(kn.s.currentA).toEqual([1.5, 0.25]);
    expect(kn.s.altM[1]).toBeCloseTo(-3.048, 12);
    // 1 mph = 0.44704 m/s exactly (1959 agreement; NIST SP 811 App. B).
    const mph = await run("t,v\n0,100\n", { columnMap: { columns: [map.columns[0], { header: "v", field: "speed", unit: "mph" }] } });
    expect(mph.s.speedMps[0]).toBeCloseTo(44.704, 12);
  });

  it("reads armed and failsafe words", async () => {
    const { s, summary } = await run("time,armed,failsafe\n0,disarmed,no\n1,ARMED,yes\n2,true,off\n3,maybe,on\n");
    expect(s.armed.slice(0, 3)).toEqual([0, 1, 1]);
    expect(s.armed[3]).toBeNaN();
    expect(s.failsafe).toEqual([0, 1, 0, 1]);
    expect(warningOf(summary, "not-a-flag")).toMatchObject({ line: 5, column: "armed", count: 1 });
  });

  it("skips ragged rows with one warning naming the first line", async () => {
    const { summary, s, samples } = await run(fixture("ragged.csv"));
    expect(s.tS).toEqual([0, 2, 4, 5]);
    expect(samples.sourceLine).toEqual([2, 4, 6, 7]);
    expect(summary.warnings).toEqual([{ code: "ragged-row", message: "This row has 3 fields; the header has 4", line: 3, count: 2 }]);
  });

  it("accepts extra empty fields at the end of a row", async () => {
    const { summary } = await run("time,v\n0,1,\n1,2,,\n");
    expect(summary.sampleCount).toBe(2);
    expect(summary.warnings).toEqual([]);
  });

  it("refuses a file where more than half of the rows are ragged", async () => {
    const e = await errorOf(run("time,lat,lon\n0,1\n1,2\n2,3,4\n"));
    expect(e.line).toBe(2);
    expect(e.message).toMatch(/^2 of 3 rows have a different number of fields than the header \(3\)/);
  });

  it("reads a non-number as NaN with one warning per column", async () => {
    const { summary, s } = await run("time,volt,hdop\n0,12.1,x\n1,n/a,1.0\n2,--,y\n3,12.0,0.9\n");
    expect(s.voltageV.map((v) => (Number.isNaN(v) ? null : v))).toEqual([12.1, null, null, 12]);
    expect(summary.warnings).toEqual([
      { code: "not-a-number", message: 'Expected a number, found "x"', line: 2, column: "hdop", count: 2 },
      { code: "not-a-number", message: 'Expected a number, found "n/a"', line: 3, column: "volt", count: 2 },
    ]);
  });

  it("drops out-of-range, non-finite and 0,0 positions with a warning", async () => {
    const text = "time,lat,lon\n0,48.1,11.5\n1,91,11.5\n2,48.1,-180.5\n3,0,0\n4,NaN,11.5\n5,48.1,Infinity\n6,48.2,\n7,48.3,11.6\n";
    const { summary, s } = await run(text);
    expect(s.lat.map((v) => (Number.isNaN(v) ? null : v))).toEqual([48.1, null, null, null, null, null, null, 48.3]);
    expect(s.lon.map((v) => (Number.isNaN(v) ? null : v))).toEqual([11.5, null, null, null, null, null, null, 11.6]);
    expect(warningOf(summary, "out-of-range")).toMatchObject({ line: 3, column: "lat", count: 4 });
    expect(summary.warnings.find((w) => w.code === "out-of-range" && w.column === "lon")).toMatchObject({ line: 4, count: 1 });
  });

  it("drops an RSSI no receiver can report (under −150 or over +30 dBm) with a warning", async () => {
    // A real sea LoRa dataset logs −255 and −226 dBm in two rows (../shared/reference/real/radio):
    // artefacts, far under the −174 dBm/Hz thermal floor of any receiver bandwidth.
    const { summary, s } = await run("time,rssi_dbm\n0,-80\n1,-255\n2,-226\n3,-150\n4,31\n");
    expect(s.rssiDbm.map((v) => (Number.isNaN(v) ? null : v))).toEqual([-80, null, null, -150, null]);
    expect(summary.warnings.find((w) => w.code === "out-of-range" && w.column === "rssi_dbm")).toMatchObject({ line: 3, count: 3 });
  });

  it("keeps rows whose time goes backwards or repeats, with warnings", async () => {
    const { summary, s } = await run("time,v\n0,1\n1,1\n0.5,1\n0.5,1\n2,1\n");
    expect(s.tS).toEqual([0, 1, 0.5, 0.5, 2]);
    expect(warningOf(summary, "time-backwards")).toMatchObject({ line: 4, count: 1, column: "time" });
    expect(warningOf(summary, "duplicate-time")).toMatchObject({ line: 5, count: 1 });
  });

  it("skips a later row whose time cannot be read", async () => {
    const { summary, samples } = await run("time,v\n0,1\nsoon,2\n,3\n2,4\n");
    expect(samples.sourceLine).toEqual([2, 5]);
    expect(warningOf(summary, "bad-time")).toMatchObject({ line: 3, count: 2, column: "time" });
  });

  it("refuses a first data row whose time cannot be read, naming line and column", async () => {
    const e = await errorOf(run("time,v\nabc,1\n1,2\n"));
    expect(e.describe()).toBe('line 2, column "time": expected seconds, milliseconds, ISO 8601 or hh:mm:ss, found "abc"');
    expect(e.expected).toBe("seconds, milliseconds, ISO 8601 or hh:mm:ss");
  });

  it("warns about a mapped column that is empty in every row", async () => {
    const { summary } = await run("time,hdop,volt\n0,,12\n1,,12\n");
    expect(summary.warnings).toEqual([
      { code: "empty-column", message: 'Column "hdop" (HDOP) is empty in every row', line: undefined, column: "hdop", count: 1 },
    ]);
  });

  it("counts blank lines in source lines and skips them", async () => {
    const { samples } = await run("\ntime,v\n\n0,1\n\n\n1,2\n");
    expect(samples.sourceLine).toEqual([4, 7]);
  });

  it("uses a given column map and fills in the detected delimiter and decimal mark", async () => {
    const columnMap: ColumnMap = { columns: [{ header: "Zeit", field: "time", unit: "ms" }, { header: "Höhe", field: "alt", unit: "ft" }] };
    const { summary, s } = await run("Zeit;Höhe;Notiz\n0;10,0;a\n500;20,0;b\n", { columnMap });
    expect(summary.columnMap).toEqual({ ...columnMap, delimiter: ";", decimal: "," });
    expect(summary.unplaced).toEqual(["Notiz"]);
    expect(s.tS).toEqual([0, 0.5]);
    expect(s.altM[1]).toBeCloseTo(6.096, 12);
  });

  it("warns about a mapped column the file does not have", async () => {
    const columnMap: ColumnMap = { delimiter: ",", decimal: ".", columns: [{ header: "t", field: "time" }, { header: "vbat", field: "voltage" }] };
    const { summary } = await run("t,v\n0,1\n", { columnMap });
    expect(warningOf(summary, "missing-column")).toMatchObject({ column: "vbat", line: 1 });
  });

  it("refuses a column map without a time column or whose time column is missing", async () => {
    const noTime = { columns: [{ header: "v", field: "voltage" }] } as ColumnMap;
    expect((await errorOf(run("t,v\n0,1\n", { columnMap: noTime }))).message).toBe("The column map has no time column; map one column to Time");
    const missing: ColumnMap = { delimiter: ",", decimal: ".", columns: [{ header: "time", field: "time" }] };
    expect((await errorOf(run("t,v\n0,1\n", { columnMap: missing }))).column).toBe("time");
  });

  it("refuses a detected map without a time column", async () => {
    const e = await errorOf(run("a,b\n1,2\n"));
    expect(e.message).toBe("The column map has no time column; map one column to Time");
  });

  it("refuses empty input, a header without rows, and binary data", async () => {
    expect((await errorOf(run(fixture("empty.csv")))).message).toBe("The file is empty");
    expect((await errorOf(run("\uFEFF\n\n"))).message).toBe("The file is empty");
    expect((await errorOf(run(fixture("header-only.csv")))).describe()).toBe("line 2: The file has a header row but no data rows");
    const map: ColumnMap = { delimiter: ",", decimal: ".", columns: [{ header: "t", field: "time" }] };
    expect((await errorOf(run("t\n", { columnMap: map }))).message).toBe("The file has a header row but no data rows");
    expect((await errorOf(run(fixture("binary.bin")))).message).toMatch(/binary data/);
  });

  it("stops at a line longer than 1 MB without reading the rest", async () => {
    let pulled = 0;
    let closed = false;
    async function* endless() {
      try {
        yield "time,v\n0,1\n";
        for (let i = 0; i < 10_000; i++) {
          pulled++;
          yield "x".repeat(64 * 1024);
        }
      } finally {
        closed = true;
      }
    }
    const e = await errorOf(parseCsv(endless(), { onBatch: () => {} }));
    expect(e.describe()).toBe("line 3: This line is longer than 1 MB; this is not a CSV telemetry log");
    expect(pulled).toBeLessThan(20);
    expect(closed).toBe(true);
  });

  it("waits for each batch to be taken before pulling more input", async () => {
    // 2000 rows of ~100 bytes in 20 chunks: the 64 KB sniff takes 7 of them, then one batch is 5.
    const rows = Array.from({ length: 2000 }, (_, i) => `${i},${i % 7},${"n".repeat(90)}\n`);
    let pulled = 0;
    async function* source() {
      yield "time,v,note\n";
      for (let i = 0; i < rows.length; i += 100) {
        pulled++;
        yield rows.slice(i, i + 100).join("");
      }
    }
    const pulledAtBatch: number[] = [];
    const pulledAfterWait: number[] = [];
    const summary = await parseCsv(source(), {
      batchSize: 500,
      onBatch: async () => {
        pulledAtBatch.push(pulled);
        for (let i = 0; i < 20; i++) await new Promise((r) => setImmediate(r));
        pulledAfterWait.push(pulled);
      },
    });
    expect(summary.sampleCount).toBe(2000);
    expect(pulledAtBatch).toHaveLength(4);
    expect(pulledAfterWait).toEqual(pulledAtBatch);
    expect(pulledAtBatch[0]).toBeLessThan(10);
    expect(pulledAtBatch.slice(1).map((p, i) => p - pulledAtBatch[i]).every((d) => d <= 6)).toBe(true);
  });

  it("hands out batches of the requested size", async () => {
    const text = "time,v\n" + Array.from({ length: 10 }, (_, i) => `${i},1`).join("\n");
    const sizes: number[] = [];
    await parseCsv(chunksOf(text), { batchSize: 4, onBatch: (b) => void sizes.push(b.length) });
    expect(sizes).toEqual([4, 4, 2]);
  });

  it("reads epoch milliseconds with the start date", async () => {
    const { summary, s } = await run("timestamp_ms,v\n1714557600000,1\n1714557600250,2\n");
    expect(s.tS).toEqual([0, 0.25]);
    expect(summary.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
  });

  it("folds headings into 0–360 and keeps RC channels beyond the eighth", async () => {
    const { s, samples } = await run("time,yaw,ch16\n0,-90,1234\n");
    expect(s.headingDeg).toEqual([270]);
    expect(samples.rc![0][15]).toBe(1234);
  });
});
