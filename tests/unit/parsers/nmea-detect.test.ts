/**
 * Detection of NMEA 0183 logs that open with junk: NUL bytes, binary frames, partial lines, long
 * comment headers, timestamps before each `$`. Sentences written here (tests/helpers/nmea.ts
 * computes the checksums by the NMEA 0183 definition).
 */
import { describe, expect, it } from "vitest";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseErrorOf } from "@/tests/helpers/parse-errors";
import { gga, rmc, sentence } from "@/tests/helpers/nmea";

const NOT_A_LOG = "This does not look like a text log (CSV, GPX or NMEA 0183)";
const fixes = (n: number) => Array.from({ length: n }, (_, i) => [gga(`1200${String(i).padStart(2, "0")}`), rmc(`1200${String(i).padStart(2, "0")}`, "070419")]).flat();

describe("detectFormat: NMEA with leading junk", () => {
  it("reads a cold start with NUL bytes as NMEA", () => {
    const text = [...fixes(2), "$GPRMC,000346.03,A,4808" + "\0".repeat(12) + "   ", sentence("PLCS,REV,PLN012054S07,070312,145743"), ...fixes(3)].join("\r\n");
    expect(detectFormat(text, "capture.log")).toBe("nmea");
    expect(detectFormat(text)).toBe("nmea"); // the name is not needed
  });

  it("reads NMEA after a block of binary (a receiver's binary protocol on the same port)", () => {
    const binary = Array.from({ length: 600 }, (_, i) => String.fromCharCode((i * 37) % 32)).join("");
    expect(detectFormat(binary + "\n" + fixes(4).join("\n"), "gps.ubx")).toBe("nmea");
    // Binary with commas and line ends of its own, outnumbering the sentences, is not taken for CSV.
    const noisy = Array.from({ length: 300 }, (_, i) => `\uFFFD\u0001,${i},\u0002\uFFFD`).join("\n");
    expect(detectFormat(noisy + "\n" + fixes(2).join("\n"))).toBe("nmea");
  });

  it("reads NMEA whose first line is the tail of a cut sentence", () => {
    expect(detectFormat(["4.03,A,4808.9992,N,4,02.3*05", ...fixes(3)].join("\n"))).toBe("nmea");
  });

  it("reads NMEA behind a comment header longer than the lines it samples", () => {
    const header = Array.from({ length: 150 }, (_, i) => `# note ${i}, with a comma`);
    expect(detectFormat([...header, ...fixes(30)].join("\n"))).toBe("nmea");
  });

  it("keeps a CSV that carries raw sentences in a column a CSV", () => {
    const rows = fixes(4).map((l, i) => `${i},-71,"${l}"`);
    expect(detectFormat(["t_s,rssi_dbm,raw", ...rows].join("\n"), "telemetry.csv")).toBe("csv");
  });

  it("still refuses binary without three checksum-valid sentences", () => {
    const binary = "PK\u0003\u0004\u0014\u0000\u0000\u0000\u0008\u0000";
    expect(parseErrorOf(() => detectFormat(binary + fixes(1).join("\n"), "log.nmea")).message).toBe(NOT_A_LOG);
    const wrong = fixes(3).map((l) => l.replace(/..$/, "00"));
    expect(parseErrorOf(() => detectFormat(binary + wrong.join("\n"), "log.nmea")).message).toBe(NOT_A_LOG);
  });
});
