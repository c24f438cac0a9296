import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { GPX_REFERENCE_DIR, parseErrorOf } from "@/tests/helpers/parse-errors";

import { detectFormat } from "@/lib/parsers/detect-format";
import { ParseError } from "@/lib/parsers/types";

const GPX_DIR = GPX_REFERENCE_DIR;
const head = (file: string) => fs.readFileSync(path.join(GPX_DIR, file), "utf8").slice(0, 64 * 1024);

// Dale DePriest, "NMEA data" (gpsinformation.org), quoted from memory.
const GGA = "$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47";
const RMC = "$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A";

const errorOf = parseErrorOf;

describe("detectFormat", () => {
  it("recognises every reference GPX file by content, whatever its name", () => {
    const files = fs.readdirSync(GPX_DIR).filter((f) => f.endsWith(".gpx"));
    expect(files.length).toBe(12);
    for (const f of files) expect(detectFormat(head(f), "upload.csv")).toBe("gpx");
  });

  it("recognises a <gpx> root after a BOM, XML declaration, comment and DOCTYPE", () => {
    const text = '\uFEFF<?xml version="1.0"?>\n<!-- exported -->\n<!DOCTYPE gpx [<!ENTITY a "b">]>\n<gpx version="1.1"></gpx>';
    expect(detectFormat(text)).toBe("gpx");
  });

  it("recognises a namespace-prefixed <gpx:gpx> root", () => {
    expect(detectFormat('<gpx:gpx xmlns:gpx="http://www.topografix.com/GPX/1/1"/>')).toBe("gpx");
  });

  it("rejects XML with another root element, naming it", () => {
    const err = errorOf(() => detectFormat('<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"/>', "track.gpx"));
    expect(err.message).toContain("<kml>");
    expect(err.expected).toBe("a <gpx> root element");
  });

  it("leaves XML whose root lies beyond the head to the GPX parser", () => {
    const text = `<?xml version="1.0"?>\n<!-- ${"x".repeat(70_000)}`;
    expect(detectFormat(text)).toBe("gpx");
  });

  it("recognises NMEA 0183 with blank lines, leading spaces and CRLF", () => {
    expect(detectFormat(`\r\n\r\n  ${GGA}\r\n${RMC}\r\n`)).toBe("nmea");
  });

  it("recognises NMEA with GN, GL talkers, AIS '!' sentences and proprietary $P sentences", () => {
    const text = ["$GNRMC,1,A*00", "$GLGSV,3,1*00", "!AIVDM,1,1,,A,15M67FC000G?ufbE`FepT@3n00Sa,0*5C", "$PUBX,00*00"].join("\n");
    expect(detectFormat(text)).toBe("nmea");
  });

  it("tolerates some junk lines among NMEA sentences", () => {
    const text = ["garbage from a serial port", GGA, RMC, "#comment", GGA, RMC].join("\n");
    expect(detectFormat(text)).toBe("nmea");
  });

  it("uses a .nmea extension to break a tie when only a few lines are sentences", () => {
    const text = ["time,note", "1,a", "2,b", "3,c", "4,d", GGA].join("\n");
    expect(detectFormat(text, "capture.nmea")).toBe("nmea");
    expect(detectFormat(text, "capture.csv")).toBe("csv");
  });

  it("recognises a CSV header with comma, semicolon, tab or pipe delimiters", () => {
    expect(detectFormat("time,lat,lon\n0,1,2\n")).toBe("csv");
    expect(detectFormat("time;lat;lon\n0;1,5;2\n")).toBe("csv");
    expect(detectFormat("time\tlat\tlon\n")).toBe("csv");
    expect(detectFormat("time|lat|lon\n")).toBe("csv");
  });

  it("decides by content even when the extension says otherwise", () => {
    expect(detectFormat("time,lat,lon\n0,1,2\n", "flight.gpx")).toBe("csv");
    expect(detectFormat(`${GGA}\n${RMC}\n`, "flight.csv")).toBe("nmea");
  });

  it("does not take a CSV whose values start with $ for NMEA", () => {
    expect(detectFormat("price,item\n$5,tea\n$7,cake\n")).toBe("csv");
  });

  it("throws 'The file is empty' for empty, BOM-only and whitespace-only input", () => {
    for (const text of ["", "\uFEFF", " \r\n\t\n"]) expect(errorOf(() => detectFormat(text)).message).toBe("The file is empty");
  });

  it("throws for binary input with NUL bytes", () => {
    const text = "PK\u0003\u0004\u0014\u0000\u0000\u0000\u0008\u0000time,lat,lon";
    expect(errorOf(() => detectFormat(text, "log.csv")).message).toBe("This does not look like a text log (CSV, GPX or NMEA 0183)");
  });

  it("throws for mostly non-printable input without NUL bytes", () => {
    const text = Array.from({ length: 400 }, (_, i) => String.fromCharCode(1 + (i % 8)) + "a,b").join("");
    expect(() => detectFormat(text)).toThrow(/does not look like a text log/);
    // Invalid UTF-8 decoded as U+FFFD counts as non-printable too.
    expect(() => detectFormat("\uFFFD\uFFFD,\uFFFD\uFFFD\n".repeat(50))).toThrow(/does not look like a text log/);
  });

  it("accepts a head that ends inside a multi-byte character", () => {
    expect(detectFormat("time,lat\n0,1\nü\uFFFD")).toBe("csv");
  });

  it("throws for plain text without delimiters", () => {
    expect(() => detectFormat("Hello,\nthis is a letter\n")).toThrow(ParseError);
    expect(() => detectFormat("just some words\nand more words\n")).toThrow(ParseError);
  });
});
