import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseErrorOf } from "@/tests/helpers/parse-errors";
import { assertText, detectNewline, sniffCsv } from "@/lib/parsers/csv-sniff";
import { ParseError } from "@/lib/parsers/types";

const FIXTURES = path.resolve(process.cwd(), "tests/fixtures/csv");
const fixture = (file: string) => fs.readFileSync(path.join(FIXTURES, file), "utf8");
const errorOf = parseErrorOf;

describe("sniffCsv", () => {
  it("reads the simulator log's header, rows and column map", () => {
    const s = sniffCsv(fixture("simulator.csv"));
    expect(s.delimiter).toBe(",");
    expect(s.decimal).toBe(".");
    expect(s.newline).toBe("\n");
    expect(s.headers).toHaveLength(26);
    expect(s.rows).toHaveLength(10);
    expect(s.rows[0].slice(0, 3)).toEqual(["0.0", "51.501200", "-0.142100"]);
    expect(s.detected.map.delimiter).toBe(",");
    expect(s.detected.unplaced).toEqual([]);
  });

  it("detects a semicolon file with comma decimals, a BOM and CRLF line breaks", () => {
    const s = sniffCsv(fixture("semicolon-comma-bom-crlf.csv"));
    expect(s).toMatchObject({ delimiter: ";", decimal: ",", newline: "\r\n" });
    expect(s.headers[0]).toBe("Time (s)");
    expect(s.rows[0]).toEqual(["0,0", "48,137500", "11,575000", "1000,0", "36,0", "100", "12,5", "Höhenhalt"]);
    expect(s.detected.map).toMatchObject({ delimiter: ";", decimal: "," });
    expect(s.detected.confidence.Lat).toBeGreaterThanOrEqual(0.9);
  });

  it("detects tab and pipe delimiters", () => {
    expect(sniffCsv("time\tlat\tlon\n0\t48.1\t11.5\n1\t48.1\t11.5\n").delimiter).toBe("\t");
    expect(sniffCsv("time|lat|lon\n0|48.1|11.5\n1|48.1|11.5\n").delimiter).toBe("|");
  });

  it("keeps the comma delimiter when a mode text contains pipes and quotes", () => {
    const s = sniffCsv(fixture("formula-mode.csv"));
    expect(s.delimiter).toBe(",");
    expect(s.rows.map((r) => r[1])).toEqual(["=cmd|' /C calc'!A0", "+SUM(1,2)", "@import", "-2+3", "=cmd|' /C calc'!A0"]);
  });

  it("reads quoted fields with delimiters, doubled quotes and line breaks inside", () => {
    const s = sniffCsv(fixture("quoted.csv"));
    expect(s.headers).toEqual(["time", "lat", "lon", "mode", "note"]);
    expect(s.rows.map((r) => r[3])).toEqual(["LOITER", "POS, HOLD", 'say "hi"', "TWO\nLINES", "LOITER"]);
  });

  it("keeps a comma decimal mark for a comma file only when quoted values use it", () => {
    expect(sniffCsv('t,v\n"0,5","12,5"\n"1,0","12,4"\n').decimal).toBe(",");
    expect(sniffCsv("t,v\n0.5,12.5\n").decimal).toBe(".");
  });

  it("returns at most the first 20 data rows", () => {
    const text = "time,v\n" + Array.from({ length: 50 }, (_, i) => `${i},1`).join("\n");
    const s = sniffCsv(text);
    expect(s.rows).toHaveLength(20);
    expect(s.rows[19]).toEqual(["19", "1"]);
  });

  it("skips blank lines", () => {
    expect(sniffCsv("\ntime,v\n\n0,1\n   \n1,2\n").rows).toEqual([["0", "1"], ["1", "2"]]);
  });

  it("drops the partial last line of a head cut from a longer file", () => {
    const s = sniffCsv("time,v\n0,1\n1,2\n2,3", { truncated: true });
    expect(s.rows).toEqual([["0", "1"], ["1", "2"]]);
    expect(sniffCsv("time,v\n0,1\n1,2\n2,3").rows).toHaveLength(3);
  });

  it("refuses an empty file", () => {
    expect(errorOf(() => sniffCsv("")).message).toBe("The file is empty");
    expect(errorOf(() => sniffCsv("\uFEFF\r\n  \r\n")).message).toBe("The file is empty");
    expect(errorOf(() => sniffCsv(fixture("empty.csv"))).describe()).toBe("The file is empty");
  });

  it("refuses a header row with no data rows, naming line 2", () => {
    const e = errorOf(() => sniffCsv(fixture("header-only.csv")));
    expect(e.describe()).toBe("line 2: The file has a header row but no data rows");
    expect(e.line).toBe(2);
  });

  it("refuses a first row of numbers instead of column names", () => {
    const e = errorOf(() => sniffCsv("0.0,48.1,11.5\n0.1,48.1,11.5\n"));
    expect(e.line).toBe(1);
    expect(e.expected).toBe("a header row of column names");
    expect(errorOf(() => sniffCsv("0,5;48,1\n0,6;48,1\n")).line).toBe(1);
  });

  it("refuses binary data", () => {
    const bytes = fs.readFileSync(path.join(FIXTURES, "binary.bin"));
    const e = errorOf(() => sniffCsv(bytes.toString("utf8")));
    expect(e.message).toBe("The file holds binary data, not text; expected a CSV telemetry log");
  });
});

describe("detectNewline", () => {
  it("takes the first line break of the text", () => {
    expect(detectNewline("a\r\nb\nc")).toBe("\r\n");
    expect(detectNewline("a\nb\r\nc")).toBe("\n");
    expect(detectNewline("a\rb")).toBe("\r");
    expect(detectNewline("abc")).toBe("\n");
  });
});

describe("assertText", () => {
  it("names the line of the first NUL byte", () => {
    expect(errorOf(() => assertText("time,v\n0,1\n1,\u0000\n")).line).toBe(3);
  });

  it("lets a few replaced characters through but not many", () => {
    expect(() => assertText("mode\n" + "Caf\uFFFD\n".repeat(2) + "x".repeat(1000))).not.toThrow();
    expect(() => assertText("\uFFFD".repeat(50) + "x".repeat(100))).toThrow(ParseError);
  });
});
