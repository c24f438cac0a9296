/**
 * Damage in an NMEA log (junk lines, NUL bytes, binary, sentences cut short or run together, bad
 * checksums) is skipped and counted in one "skipped-junk" warning; the file is read while a usable
 * sentence remains. Sentences are written here, checksums computed by the NMEA 0183 definition
 * (tests/helpers/nmea.ts). The damaged shapes imitate those GPSD's gp-320fw cold-boot capture shows
 * (../shared/reference/real/SOURCES.md §1), written afresh.
 */
import { describe, expect, it } from "vitest";
import { parseNmea } from "@/lib/parsers/nmea";
import type { ParseSummary } from "@/lib/parsers/types";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";
import { gga, rmc, sentence } from "@/tests/helpers/nmea";

async function run(input: string | Uint8Array, chunk = 3) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseNmea(byteChunks(input, chunk), { onBatch });
  return { summary, s: samples.columns, samples };
}
const junkOf = (summary: ParseSummary) => summary.warnings.find((w) => w.code === "skipped-junk");
const GSA = sentence("GPGSA,A,1,,,,,,,,,,,,,,,");

describe("parseNmea: junk is skipped and counted once", () => {
  it("reads a sentence followed by NUL padding and skips one cut short by NUL bytes", async () => {
    const cut = rmc("120001", "070419").slice(0, 20) + "\0".repeat(12) + "   ";
    const { summary, s } = await run([gga("120000") + "\0\0\0", cut, gga("120002")].join("\r\n"));
    expect(summary.sampleCount).toBe(2);
    expect(s.tS).toEqual([0, 2]);
    expect(junkOf(summary)).toMatchObject({ line: 2, count: 1, message: expect.stringContaining("1 sentence cut short or run together") });
  });

  it("reads the complete sentence of two run together and counts the cut one", async () => {
    // A GSV cut off by the next sentence's `$`, then a whole RMC on the same line.
    const line = "$GPGSV,3,1,11,23,87,270,,13,68,270," + rmc("120000", "070419");
    const { summary, s } = await run([line, GSA + rmc("120001", "070419")].join("\n"));
    expect(summary.sampleCount).toBe(2);
    expect(s.fixType).toEqual([1, 1]);
    expect(junkOf(summary)).toMatchObject({ line: 1, count: 1 });
  });

  it("counts a sentence whose checksum is followed by the tail of another as damaged", async () => {
    const merged = GSA + "0,*4E"; // "$GPGSA,…*1E0,*4E": two checksums, neither ends a whole sentence
    const { summary } = await run([merged, gga("120000")].join("\n"));
    expect(junkOf(summary)).toMatchObject({ line: 1, count: 1, message: expect.stringContaining("1 sentence with a wrong checksum") });
  });

  it("counts a malformed address with a valid checksum ($GPN,… left from a damaged line)", async () => {
    const { summary } = await run([sentence("GPN,00000.0000,E,0,00,0.0,,M,,M,,"), gga("120000")].join("\n"));
    expect(junkOf(summary)).toMatchObject({ count: 1, message: expect.stringContaining("1 sentence malformed despite a valid checksum") });
  });

  it("counts binary lines and fragments without a `$` as lines that are not NMEA", async () => {
    const bytes = new Uint8Array([...new TextEncoder().encode(gga("120000") + "\n"), 0xb5, 0x62, 0x01, 0x07, 0xff, 0x0a, ...new TextEncoder().encode(",,,,,,*1E\n" + gga("120001") + "\n")]);
    const { summary } = await run(bytes);
    expect(summary.sampleCount).toBe(2);
    expect(junkOf(summary)).toMatchObject({ line: 2, count: 2, message: expect.stringContaining("2 lines of non-NMEA text") });
  });

  it("puts every kind in one warning with the first line and the total", async () => {
    const lines = ["garbage", gga("120000").replace(/..$/, "00"), "$GPRMC,1200", sentence("GPN,1"), gga("120000")];
    const { summary } = await run(lines.join("\n"));
    expect(summary.warnings).toEqual([
      {
        code: "skipped-junk",
        message:
          "Damaged or unreadable text was skipped: 1 sentence with a wrong checksum, 1 sentence cut short or run together (no checksum at the end), 1 sentence malformed despite a valid checksum, 1 line of non-NMEA text (binary, NUL bytes, partial lines)",
        line: 1,
        count: 4,
      },
    ]);
  });

  it("reads a log that is mostly junk as long as one usable sentence remains", async () => {
    const junk = Array.from({ length: 200 }, (_, i) => (i % 2 ? "\0\0\0\0" : "$GPGSV,3,1,12,20,76,0"));
    const { summary, s } = await run([...junk, gga("000343.03"), ...junk].join("\r\n"), 64);
    expect(summary.sampleCount).toBe(1);
    expect(s.fixType).toEqual([1]);
    expect(junkOf(summary)?.count).toBe(200); // the NUL-only lines are blank once NULs are trimmed
  });

  it("passes over # comment lines (GPSD capture headers) and well-formed sentences it does not use", async () => {
    const lines = ["# Name: a receiver", "#   $GPGSV,3,3,12,2,40,16,00,090,*72", sentence("PORZD,A,024.2"), sentence("GPTXT,01,01,02,ANTENNA OK"), GSA, gga("120000")];
    const { summary } = await run(lines.join("\n"));
    expect(summary.sampleCount).toBe(1);
    expect(summary.warnings).toEqual([]);
  });
});
