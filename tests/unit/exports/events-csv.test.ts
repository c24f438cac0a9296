/**
 * Events CSV: RFC 4180 layout (CRLF, quoted text with doubled quotes) and the OWASP "CSV Injection"
 * advice (https://owasp.org/www-community/attacks/CSV_Injection): cells starting with = + - @ tab
 * or carriage return get a leading apostrophe, and text cells are quoted so an embedded separator
 * cannot open a new cell. Numbers stay numbers.
 */
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { csvNumber, csvText, EVENTS_CSV_HEADER, writeEventsCsv, type CsvEvent } from "@/lib/exports/events-csv";

const ev = (over: Partial<CsvEvent> = {}): CsvEvent => ({
  kind: "link-lost",
  startS: 101.25,
  endS: 104.75,
  peak: -112.5,
  threshold: -102,
  lat: 53.4712345678,
  lon: -3.0512345678,
  distanceFromHomeM: 412.36,
  detail: { unit: "dBm" },
  ...over,
});

const parse = (csv: string) => Papa.parse<string[]>(csv.replace(/^\uFEFF/, ""), { skipEmptyLines: true }).data;

describe("events CSV", () => {
  it("writes the header and one row per event, numbers as plain numbers (a minus sign is not escaped)", () => {
    const csv = writeEventsCsv([ev()]);
    expect(csv.startsWith("\uFEFF")).toBe(true);
    expect(csv.endsWith("\r\n")).toBe(true);
    const [header, row] = csv.slice(1).split("\r\n");
    expect(header).toBe(EVENTS_CSV_HEADER.join(","));
    expect(row).toBe('"link-lost",101.25,104.75,3.5,-112.5,-102,"dBm",53.4712346,-3.0512346,412.4,');
  });

  it.each([
    ["=HYPERLINK(\"http://evil.example\",\"x\")", "'=HYPERLINK"],
    ["+1+2", "'+1+2"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1:A2)", "'@SUM"],
    ["\tTAB", "'\tTAB"],
    ["\rCR", "'\rCR"],
  ])("defuses a waypoint named %j (OWASP CSV Injection)", (name, start) => {
    const csv = writeEventsCsv([ev({ kind: "waypoint-missed", detail: { waypoint: name, unit: "m" } })]);
    const cells = parse(csv)[1];
    expect(cells[10].startsWith(start)).toBe(true);
    expect(cells[10]).toBe(`'${name}`);
  });

  it("quotes separators, quotes and line breaks so they stay inside their cell (RFC 4180 §2.6–2.7)", () => {
    const name = 'Gate "B", north\r\n=cmd|\' /C calc\'!A0';
    const csv = writeEventsCsv([ev({ kind: "off-route", detail: { from: name, to: "C;D" } })]);
    const rows = parse(csv);
    expect(rows).toHaveLength(2);
    expect(rows[1]).toHaveLength(EVENTS_CSV_HEADER.length);
    expect(rows[1][10]).toBe(`${name} → C;D`);
    expect(csvText('a"b')).toBe('"a""b"');
  });

  it("leaves missing values empty and never writes exponent notation", () => {
    const row = parse(writeEventsCsv([ev({ peak: null, threshold: null, lat: null, lon: null, distanceFromHomeM: null, detail: null })]))[1];
    expect(row.slice(4)).toEqual(["", "", "", "", "", "", ""]);
    expect(csvNumber(1e-9)).toBe("0");
    expect(csvNumber(123456789.123456)).toBe("123456789.123");
    expect(csvNumber(NaN)).toBe("");
  });
});
