/**
 * Dates and roll-overs of NMEA logs (lib/parsers/nmea-timeline.ts through parseNmea). Expected
 * dates are worked out by hand here: the week number is sent modulo 1024 (IS-GPS-200
 * §20.3.3.3.1.1) and GPS weeks are 7 × 86,400 s, so the roll-over moves a date back 7,168 days (2019-04-07 − 7,168 days = 1999-08-22, the date GPSD's gp-320fw capture shows
 * after its cold boot, ../shared/reference/real/SOURCES.md §1).
 */
import { describe, expect, it } from "vitest";
import { parseNmea } from "@/lib/parsers/nmea";
import { EARLIEST_YEAR, MAX_DATE_JUMP_DAYS, NmeaTimeline } from "@/lib/parsers/nmea-timeline";
import type { ParseSummary } from "@/lib/parsers/types";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";
import { gga, rmc } from "@/tests/helpers/nmea";

async function run(lines: string[]) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseNmea(byteChunks(lines.join("\n"), 11), { onBatch });
  return { summary, s: samples.columns };
}
const bogusOf = (summary: ParseSummary) => summary.warnings.find((w) => w.code === "bogus-date");
const DAY_MS = 86_400_000;

describe("parseNmea: bogus dates", () => {
  it("checks the roll-over arithmetic the tests rely on", () => {
    expect(Date.UTC(2019, 3, 7) - 1024 * 7 * DAY_MS).toBe(Date.UTC(1999, 7, 22));
    expect(EARLIEST_YEAR).toBe(2000);
  });

  it("does not date the run from a date before 2000 (the 1999 GPS week roll-over, 220899)", async () => {
    const { summary, s } = await run([rmc("000425.00", "220899"), rmc("000426.00", "220899")]);
    expect(summary.startedAt).toBeNull();
    expect(s.tS).toEqual([0, 1]); // the time of day is still used
    expect(bogusOf(summary)).toMatchObject({ line: 1, count: 2, message: expect.stringMatching(/1999-08-22 \(line 1\) is before 2000.*the run is undated$/) });
  });

  it("dates the run from the good date when roll-over dates come later", async () => {
    const { summary } = await run([rmc("000345.03", "070419"), rmc("000425.00", "220899", { status: "V" })]);
    expect(summary.startedAt?.toISOString()).toBe("2019-04-07T00:03:45.030Z");
    expect(bogusOf(summary)).toMatchObject({ line: 2, count: 1 });
  });

  it("ignores dates that jump years within the log and keeps the timeline on the time of day", async () => {
    // A fix on 2019-04-07, then a receiver restart printing its default date 2006-12-16.
    const { summary, s } = await run([rmc("000345.03", "070419"), rmc("000350.00", "161206", { status: "V" }), rmc("000351.00", "161206", { status: "V" })]);
    expect(summary.startedAt?.toISOString()).toBe("2019-04-07T00:03:45.030Z");
    expect(s.tS.map((t) => Math.round(t * 100) / 100)).toEqual([0, 4.97, 5.97]);
    expect(bogusOf(summary)).toMatchObject({ line: 2, count: 2, message: expect.stringContaining("2006-12-16 (line 2) is more than 30 days from the run's date 2019-04-07") });
  });

  it("lets a fix's date overrule an earlier date from a receiver warning (status V)", async () => {
    const { summary } = await run([rmc("235948.00", "161206", { status: "V" }), rmc("235949.00", "161206", { status: "V" }), rmc("235950.00", "070419")]);
    expect(summary.startedAt?.toISOString()).toBe("2019-04-07T23:59:48.000Z");
    expect(bogusOf(summary)).toMatchObject({ line: 1, count: 2 });
  });

  it("dates the run from a status-V date when no fix ever disagrees", async () => {
    const { summary } = await run([rmc("120000", "010319", { status: "V" }), rmc("120001", "010319", { status: "V" })]);
    expect(summary.startedAt?.toISOString()).toBe("2019-03-01T12:00:00.000Z");
    expect(summary.warnings).toEqual([]);
  });

  it(`accepts a pause of ${MAX_DATE_JUMP_DAYS} days between fixes and calls ${MAX_DATE_JUMP_DAYS + 1} a jump`, async () => {
    const ok = await run([rmc("120000", "010319"), rmc("120000", "310319")]);
    expect(ok.s.tS).toEqual([0, 30 * 86_400]);
    expect(ok.summary.warnings).toEqual([]);
    const jump = await run([rmc("120000", "010319"), rmc("120000", "010419")]);
    expect(jump.s.tS).toEqual([0, 0]); // the same time of day, the date ignored
    expect(bogusOf(jump.summary)).toMatchObject({ line: 2, count: 1 });
  });
});

describe("parseNmea: roll-overs keep tS continuous", () => {
  it("crosses midnight with RMC dates (31 Dec 2019 → 1 Jan 2020)", async () => {
    const { summary, s } = await run([rmc("235959", "311219"), gga("000000"), rmc("000001", "010120")]);
    expect(s.tS).toEqual([0, 1, 2]);
    expect(summary.startedAt?.toISOString()).toBe("2019-12-31T23:59:59.000Z");
    expect(summary.warnings).toEqual([]);
  });

  it("crosses the hour (00:59:59 → 01:00:00) with fractional seconds", async () => {
    const { s } = await run([rmc("005959.50", "080710"), rmc("010000.00", "080710"), rmc("010000.50", "080710")]);
    expect(s.tS).toEqual([0, 0.5, 1]);
  });

  it("crosses midnight without dates (void RMC times 23:59:59 → 00:00:02)", async () => {
    const { s, summary } = await run([gga("235959.00", { quality: 0 }), gga("000002.00", { quality: 0 })]);
    expect(s.tS).toEqual([0, 3]);
    expect(summary.warnings).toEqual([]);
  });

  it("steps back over midnight when a clock without a date goes back a little, instead of a day forward", async () => {
    const { s, summary } = await run([gga("000005"), gga("235955")]);
    expect(s.tS).toEqual([0, -10]);
    expect(summary.warnings.map((w) => w.code)).toEqual(["time-backwards"]);
  });
});

describe("NmeaTimeline", () => {
  it("puts an undated time of day on the day nearest the previous one", () => {
    const t = new NmeaTimeline();
    expect(t.place(86_000, null, false, 1)).toBe(86_000);
    expect(t.place(100, null, false, 2)).toBe(86_500); // next day
    expect(t.place(86_300, null, false, 3)).toBe(86_300); // back to the first day (a clock stepping back)
    expect(t.startedAt(0)).toBeNull();
    expect(t.warning()).toBeNull();
  });
});
