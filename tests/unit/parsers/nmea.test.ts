import { describe, expect, it } from "vitest";
import { parseNmea } from "@/lib/parsers/nmea";
import { ParseError, type ParseSummary } from "@/lib/parsers/types";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";
import { sentence, xorChecksum } from "@/tests/helpers/nmea";

// Published examples from Dale DePriest, "NMEA data" (gpsinformation.org), quoted from memory;
// their checksums are verified below by XOR, so a misremembered character would show.
const GGA = "$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47";
const RMC = "$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A";
const VTG = "$GPVTG,054.7,T,034.4,M,005.5,N,010.2,K*48";
const GSA = "$GPGSA,A,3,04,05,,09,12,,,24,,,,,2.5,1.3,2.1*39";
// Cold-start output with no fix and no time, as u-blox receivers print it (quoted from memory).
const GGA_COLD = "$GPGGA,,,,,,0,00,99.99,,,,,,*48";


async function run(text: string, opts: { batchSize?: number; chunk?: number } = {}) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseNmea(byteChunks(text, opts.chunk ?? 7), { onBatch, batchSize: opts.batchSize });
  return { summary, s: samples.columns, samples };
}
const warning = (summary: ParseSummary, code: string) => summary.warnings.find((w) => w.code === code);

describe("parseNmea", () => {
  it("uses published sentences whose checksums match the XOR definition", () => {
    for (const s of [GGA, RMC, VTG, GSA, GGA_COLD]) {
      const [body, sum] = s.slice(1).split("*");
      expect(xorChecksum(body)).toBe(sum);
    }
  });

  it("merges the DePriest GGA and RMC of 12:35:19 into one sample with converted units", async () => {
    const { summary, s } = await run(`${GGA}\r\n${RMC}\r\n`);
    expect(summary.sampleCount).toBe(1);
    expect(s.lat[0]).toBeCloseTo(48 + 7.038 / 60, 9); // 48.1173
    expect(s.lon[0]).toBeCloseTo(11 + 31 / 60, 9); // 11.516666…
    expect(s.sats[0]).toBe(8);
    expect(s.hdop[0]).toBe(0.9);
    expect(s.altM[0]).toBe(545.4);
    expect(s.speedMps[0]).toBeCloseTo(11.5236, 4); // 22.4 kn × 1852 m / 3600 s
    expect(s.headingDeg[0]).toBe(84.4);
    expect(s.fixType[0]).toBe(1); // GGA quality 1 = GPS fix
    expect(s.tS[0]).toBe(0);
    // 23 March 1994 is before 2000: read as a GPS week roll-over symptom, so the run stays undated.
    expect(summary.startedAt).toBeNull();
    expect(summary.format).toBe("nmea");
    expect(summary.warnings.map((w) => w.code)).toEqual(["bogus-date"]);
  });

  it("dates the same pair when its date is after 2000", async () => {
    const rmc2019 = sentence(RMC.slice(1, -3).replace("230394", "230319"));
    const { summary } = await run(`${GGA}\r\n${rmc2019}\r\n`);
    expect(summary.startedAt?.toISOString()).toBe("2019-03-23T12:35:19.000Z");
    expect(summary.warnings).toEqual([]);
  });

  it("counts a corrupted checksum as skipped junk with its line and keeps parsing", async () => {
    const corrupted = GGA.replace("545.4", "545.5"); // same *47, now wrong
    const nextRmc = sentence(RMC.slice(1, -3).replace("123519", "123520"));
    const { summary, s } = await run([RMC, corrupted, nextRmc].join("\n"));
    expect(warning(summary, "skipped-junk")).toMatchObject({ line: 2, count: 1, message: expect.stringContaining("1 sentence with a wrong checksum") });
    expect(summary.sampleCount).toBe(2);
    expect(s.altM).toEqual([NaN, NaN]); // the corrupted GGA contributed nothing
  });

  it("treats a sentence without a checksum as cut short", async () => {
    const { summary } = await run(`${RMC}\n${GGA.slice(0, -3)}\n`);
    expect(warning(summary, "skipped-junk")).toMatchObject({ line: 2, message: expect.stringContaining("1 sentence cut short") });
  });

  it("merges VTG into the sample of the current fix time and converts km/h to m/s", async () => {
    const gga = sentence("GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,");
    const { summary, s } = await run([gga, VTG, GSA].join("\n"));
    expect(summary.sampleCount).toBe(1);
    expect(s.speedMps[0]).toBeCloseTo(10.2 / 3.6, 9); // DePriest VTG: 10.2 km/h
    expect(s.headingDeg[0]).toBe(54.7); // course true, not the 34.4 magnetic
  });

  it("gives a VTG that arrives before any fix to the first sample", async () => {
    const { s } = await run([VTG, GGA].join("\n"));
    expect(s.headingDeg).toEqual([54.7]);
  });

  it("keeps RMC's speed when a VTG in the same fix disagrees (first value wins)", async () => {
    const { s } = await run([RMC, VTG, GGA].join("\n"));
    expect(s.speedMps[0]).toBeCloseTo(22.4 * (1852 / 3600), 9);
  });

  it("adds a day when the time of day rolls over midnight with GGA only", async () => {
    const lines = ["235958", "235959", "000000", "000001"].map((t) => sentence(`GPGGA,${t},4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,`));
    const { summary, s } = await run(lines.join("\r\n"));
    expect(s.tS).toEqual([0, 1, 2, 3]);
    expect(summary.startedAt).toBeNull(); // GGA carries no date
    expect(warning(summary, "time-backwards")).toBeUndefined();
  });

  it("dates samples across midnight from RMC and from the roll-over between RMC dates", async () => {
    const rmc = (t: string, d: string) => sentence(`GPRMC,${t},A,4807.038,N,01131.000,E,000.0,000.0,${d},,`);
    const gga = (t: string) => sentence(`GPGGA,${t},4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,`);
    // 31 Dec 1999 23:59:59 → GGA-only 00:00:00 (roll-over) → RMC 1 Jan 2000 00:00:01.
    const { summary, s } = await run([rmc("235959", "311299"), gga("000000"), rmc("000001", "010100")].join("\n"));
    expect(s.tS).toEqual([0, 1, 2]);
    expect(summary.startedAt?.toISOString()).toBe("1999-12-31T23:59:59.000Z");
  });

  it("trusts RMC dates over the roll-over guess when the log pauses for more than a day", async () => {
    const rmc = (t: string, d: string) => sentence(`GPRMC,${t},A,4807.038,N,01131.000,E,000.0,000.0,${d},,`);
    // 23:59:59 on 1 Mar 2021, then 12:00:00 on 3 Mar 2021: 1 day 12 h 1 s later.
    const { s } = await run([rmc("235959", "010321"), rmc("120000", "030321")].join("\n"));
    expect(s.tS).toEqual([0, 86_400 + 12 * 3600 + 1]);
  });

  it("takes the date from a later RMC for earlier GGA-only samples", async () => {
    const gga = sentence("GPGGA,123518,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,");
    const rmc2019 = sentence(RMC.slice(1, -3).replace("230394", "230319"));
    const { summary, s } = await run([gga, GGA, rmc2019].join("\n"));
    expect(s.tS).toEqual([0, 1]);
    expect(summary.startedAt?.toISOString()).toBe("2019-03-23T12:35:18.000Z");
  });

  it("keeps fractional seconds of a 5 Hz log", async () => {
    const lines = ["120000.00", "120000.20", "120000.40"].map((t) => sentence(`GNGGA,${t},4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,`));
    const { s } = await run(lines.join("\n"));
    s.tS.forEach((t, i) => expect(t).toBeCloseTo(i * 0.2, 9));
  });

  it("leaves position empty (not 0) for a GGA without a fix and an RMC with status V", async () => {
    const ggaNoFix = sentence("GPGGA,120000,,,,,0,00,99.99,,,,,,");
    const rmcV = sentence("GPRMC,120001,V,4807.038,N,01131.000,E,022.4,084.4,230394,,");
    const { summary, s } = await run([ggaNoFix, rmcV].join("\n"));
    expect(s.lat).toEqual([NaN, NaN]);
    expect(s.lon).toEqual([NaN, NaN]);
    expect(s.speedMps).toEqual([NaN, NaN]);
    expect(s.fixType).toEqual([0, 0]);
    expect(s.sats).toEqual([0, NaN]);
    expect(summary.fieldsPresent).not.toContain("lat");
  });

  it("passes over GGA/RMC without a time or position (u-blox cold start) silently", async () => {
    const { summary } = await run([GGA_COLD, sentence("GPRMC,,V,,,,,,,,,,N"), GGA].join("\n"));
    expect(summary.sampleCount).toBe(1);
    expect(summary.warnings).toEqual([]);
  });

  it("warns about a GGA that has a position but no time, which cannot be placed", async () => {
    const { summary } = await run([sentence("GPGGA,,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,"), GGA].join("\n"));
    expect(summary.sampleCount).toBe(1);
    expect(warning(summary, "missing-time")).toMatchObject({ line: 1, count: 1 });
  });

  it("counts junk lines as skipped junk and ignores well-formed sentences it does not use (GSA, unknown ids)", async () => {
    const unknown = sentence("GPXYZ,1,2,3");
    const { summary } = await run(["hello", unknown, GSA, GGA, "", "more junk"].join("\n"));
    expect(warning(summary, "skipped-junk")).toMatchObject({ line: 1, count: 2, message: expect.stringContaining("2 lines of non-NMEA text") });
    expect(summary.warnings.map((w) => w.code)).toEqual(["skipped-junk"]);
  });

  it("reads two sentences run together on one line and junk before the $", async () => {
    const { summary, s } = await run(`12:35:19.001 ${GGA}${RMC}\n`);
    expect(summary.sampleCount).toBe(1);
    expect(s.altM[0]).toBe(545.4);
    expect(s.headingDeg[0]).toBe(84.4);
  });

  it("keeps a sample whose time goes backwards and warns", async () => {
    const lines = ["120010", "120005"].map((t) => sentence(`GPGGA,${t},4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,`));
    const { summary, s } = await run(lines.join("\n"));
    expect(s.tS).toEqual([0, -5]);
    expect(warning(summary, "time-backwards")).toMatchObject({ line: 2 });
  });

  it("gives the same samples for 1-byte, 7-byte and whole-input chunks, with CRLF", async () => {
    const times = Array.from({ length: 30 }, (_, i) => `1235${String(i + 10).padStart(2, "0")}`);
    const text = times.map((t) => [sentence(`GPRMC,${t},A,4807.038,N,01131.000,E,022.4,084.4,230394,,`), VTG, sentence(`GPGGA,${t},4807.038,N,01131.000,E,2,09,1.1,545.4,M,46.9,M,,`)].join("\r\n")).join("\r\n");
    const whole = await run(text, { chunk: text.length });
    expect(whole.summary.sampleCount).toBe(30);
    expect(whole.s.fixType.every((f) => f === 2)).toBe(true);
    expect((await run(text, { chunk: 7 })).s).toEqual(whole.s);
    expect((await run(text, { chunk: 1 })).s).toEqual(whole.s);
    expect(whole.samples.sourceLine.slice(0, 2)).toEqual([1, 4]); // first line of each fix
  });

  it("emits batches of batchSize in order", async () => {
    const lines = Array.from({ length: 25 }, (_, i) => sentence(`GPGGA,1200${String(i + 10)},4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,`));
    const { samples, s } = await run(lines.join("\n"), { batchSize: 10 });
    expect(samples.batches).toBe(3);
    expect(s.tS).toEqual(Array.from({ length: 25 }, (_, i) => i));
  });

  it("throws a ParseError when no GGA or RMC sentence could be used", async () => {
    const bad = GGA.replace("*47", "*00");
    const err = await run([GSA, VTG, "junk", bad].join("\n")).catch((e) => e);
    expect(err).toBeInstanceOf(ParseError);
    expect(err.message).toBe("No NMEA 0183 position sentences (GGA, RMC) found");
  });
});
