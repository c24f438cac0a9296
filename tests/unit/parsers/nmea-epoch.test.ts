/**
 * One sample per fix epoch across talkers (lib/parsers/nmea-epoch.ts through parseNmea), on
 * hand-written sentences whose checksums tests/helpers/nmea.ts computes by the NMEA 0183
 * definition (XOR of the characters between `$` and `*`).
 */
import { describe, expect, it } from "vitest";
import { OPEN_EPOCHS } from "@/lib/parsers/nmea-epoch";
import { parseNmea } from "@/lib/parsers/nmea";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";
import { gga, rmc, sentence } from "@/tests/helpers/nmea";

async function run(lines: string[]) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseNmea(byteChunks(lines.join("\r\n") + "\r\n", 5), { onBatch });
  return { summary, s: samples.columns, samples };
}
const KN = 1852 / 3600; // m/s per knot, exact (1 nmi = 1852 m)

describe("parseNmea: one sample per fix epoch", () => {
  it("makes one sample of GPGGA, GLGGA and GNRMC with the same time and sums the constellations' satellites", async () => {
    // SiRFstarV style: each constellation's GGA counts only its own satellites (8 GPS + 2 GLONASS).
    const { summary, s } = await run([gga("020935.000", { sats: "08" }), gga("020935.000", { talker: "GL", sats: "02" }), rmc("020935.000", "050219", { talker: "GN" })]);
    expect(summary.sampleCount).toBe(1);
    expect(s.sats).toEqual([10]);
    expect(s.speedMps[0]).toBeCloseTo(22.4 * KN, 9);
    expect(summary.startedAt?.toISOString()).toBe("2019-02-05T02:09:35.000Z");
  });

  it("takes a GN (combined) GGA's satellites and position alone when one is present", async () => {
    const lines = [gga("120000", { sats: "07", lat: "4807.000" }), gga("120000", { talker: "GN", sats: "12", lat: "4807.100" }), gga("120000", { talker: "GL", sats: "05" })];
    const { s } = await run(lines);
    expect(s.sats).toEqual([12]);
    expect(s.lat[0]).toBeCloseTo(48 + 7.1 / 60, 9);
  });

  it("prefers a GGA with a fix over one without in the same epoch, whatever their order", async () => {
    const { s } = await run([gga("120000", { talker: "GL", quality: 0, sats: "00" }), gga("120000", { sats: "06" })]);
    expect(s.fixType).toEqual([1]);
    expect(s.lat[0]).toBeCloseTo(48 + 7.038 / 60, 9);
    expect(s.sats).toEqual([6]);
  });

  it("joins sentences of one epoch however they interleave with the next epoch's", async () => {
    // GGA of 12:00:01 arrives before RMC of 12:00:00 (talkers written out of step).
    const { summary, s, samples } = await run([gga("120000"), gga("120001"), rmc("120000", "010319"), rmc("120001", "010319")]);
    expect(summary.sampleCount).toBe(2);
    expect(s.tS).toEqual([0, 1]);
    expect(s.speedMps.map((v) => v / KN)).toEqual([expect.closeTo(22.4, 9), expect.closeTo(22.4, 9)]);
    expect(samples.sourceLine).toEqual([1, 2]); // each sample names its epoch's first line
    expect(summary.warnings).toEqual([]);
  });

  it("takes the GGA position over an RMC of the same time that arrived first (a receiver whose RMC lags)", async () => {
    const { s } = await run([rmc("094737", "200818", { lat: "5251.0093" }), gga("094737", { lat: "5251.0085" })]);
    expect(s.lat[0]).toBeCloseTo(52 + 51.0085 / 60, 9);
  });

  it("uses a valid RMC's position when the epoch has no GGA, and none from an RMC with status V", async () => {
    const { s } = await run([rmc("120000", "010319"), rmc("120001", "010319", { status: "V" })]);
    expect(s.lat[0]).toBeCloseTo(48 + 7.038 / 60, 9);
    expect(s.lat[1]).toBeNaN();
    expect(s.fixType).toEqual([1, 0]);
  });

  it("keeps two RMCs with the same time but different dates apart", async () => {
    const { summary, s } = await run([rmc("120000", "010319"), gga("120000"), rmc("120000", "020319")]);
    expect(summary.sampleCount).toBe(2);
    expect(s.tS).toEqual([0, 86_400]);
  });

  it("gives VTG to the epoch of the GGA/RMC just before it, not to the newest open epoch", async () => {
    const vtg = sentence("GPVTG,054.7,T,034.4,M,005.5,N,010.2,K"); // DePriest's VTG: 10.2 km/h at 54.7° true
    const { s } = await run([gga("120000"), gga("120001"), gga("120000", { talker: "GL" }), vtg]);
    expect(s.headingDeg).toEqual([54.7, NaN]);
    expect(s.speedMps[0]).toBeCloseTo(10.2 / 3.6, 9);
  });

  it(`holds only ${OPEN_EPOCHS} epochs open: a sentence later than that becomes a sample of its own`, async () => {
    const times = Array.from({ length: OPEN_EPOCHS + 2 }, (_, i) => `1200${String(i).padStart(2, "0")}`);
    const { summary, s } = await run([...times.map((t) => gga(t)), rmc(times[0], "010319")]);
    expect(summary.sampleCount).toBe(times.length + 1);
    expect(s.tS.at(-1)).toBe(0); // back to 12:00:00
    expect(summary.warnings.map((w) => w.code)).toEqual(["time-backwards"]);
  });

  it("streams: the first batch leaves before the source is read to its end", async () => {
    const n = 2000;
    let pulled = 0;
    let pulledAtFirstBatch = -1;
    async function* source() {
      for (let i = 0; i < n; i++) {
        pulled++;
        const t = 36_000 + i; // 10:00:00 + i s, in seconds since midnight
        const hh = Math.floor(t / 3600) % 24;
        const mm = Math.floor((t % 3600) / 60);
        const ss = t % 60;
        yield gga([hh, mm, ss].map((v) => String(v).padStart(2, "0")).join("")) + "\n";
      }
    }
    const summary = await parseNmea(source(), {
      batchSize: 100,
      onBatch: () => {
        if (pulledAtFirstBatch < 0) pulledAtFirstBatch = pulled;
      },
    });
    expect(summary.sampleCount).toBe(n);
    // 100 samples per batch plus the open epochs and one line of look-ahead in the line reader.
    expect(pulledAtFirstBatch).toBeLessThanOrEqual(100 + OPEN_EPOCHS + 2);
  });
});
