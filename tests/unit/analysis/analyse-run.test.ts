import { describe, expect, it } from "vitest";
import { analyseRun, assessmentGaps, NO_TIMES_WHY, runDuration } from "@/lib/analysis/analyse-run";
import type { BuildConfig } from "@/lib/analysis/types";
import { makeSeries, rcColumn } from "@/tests/helpers/series";
import { toLatLon, walk } from "./geo-path";

// Synthetic runs written for these tests (our own data), 10 Hz. The practices come from
// DESIGN.md §10; the µs → % mapping (1000–2000 µs = 0–100 %) is common practice.

/** A bench test: armed 30 s, no GPS, transmitter off 10–20 s; RSSI on channel 14, RTH channel 8 at 1900 µs 0.4 s after the loss. */
function bench(fields: Parameters<typeof makeSeries>[1] = {}, modeNames: string[] = []) {
  const n = 300;
  const off = (i: number) => i >= 100 && i < 200;
  return makeSeries(
    n,
    {
      armed: () => 1,
      voltageV: () => 16.4,
      rc: rcColumn(n, { 14: (i) => (off(i) ? 1000 : 1980), 8: (i) => (i >= 104 && i < 200 ? 1900 : 1000) }),
      ...fields,
    },
    { modeNames },
  );
}
const benchBuild: BuildConfig = {
  vehicleType: "multirotor",
  cells: 4,
  failsafe: { action: "return-to-home", expectedWithinS: 1 },
  channels: [
    { channel: 8, function: "return-to-home", failsafeUs: 1900 },
    { channel: 14, function: "rssi" },
  ],
};

describe("analyseRun on a bench failsafe test", () => {
  it("still acts on a bench test whose failsafe came late", () => {
    const late = { ...benchBuild, failsafe: { action: "return-to-home" as const, expectedWithinS: 0.2 } };
    const v = analyseRun(bench(), { build: late }).summary.verdict;
    expect(v).toMatchObject({ level: "act", reasons: ["Failsafe acted later than planned"] });
  });

  it("reads the link from channel 14, the command from channel 8, and does not call a missing mode column a wrong action", () => {
    const r = analyseRun(bench(), { build: benchBuild });
    const s = r.summary;
    expect(s.bench).toBe(true);
    expect(s.home).toBeNull();
    expect(s.link).toMatchObject({ metric: "rssi-pct", source: { kind: "rc-channel", channel: 14 }, lostCount: 1, fadeCount: 0 });
    const loss = r.events.find((e) => e.kind === "link-lost")!;
    expect([loss.startS, loss.endS]).toEqual([10, 20]);
    expect(s.failsafe).toMatchObject({
      result: "pass",
      commanded: { by: "rc-channel", channel: 8, latencyS: expect.closeTo(0.4, 9) },
      flown: { state: "not-logged" },
    });
    // The loss is the test (the transmitter switched off on purpose), not a fault of the run.
    expect(s.verdict.level).toBe("clear");
    expect(s.verdict.reasons).toEqual([]);
    expect(s.verdict.notAssessed.map((g) => g.what)).toEqual(["link", "route", "gps"]);
    expect(s.verdict.notAssessed[0].why).toMatch(/bench test/);
    expect(s.verdict.held).toEqual(["failsafe", "battery"]);
    expect(s.route).toBeNull();
    expect(r.perSample.rssiRcPct?.[0]).toBe(98);
  });

  it("reads the mode when one is logged: flown by mode with its latency", () => {
    const s = bench({ modeIndex: (i) => (i >= 106 && i < 200 ? 1 : 0) }, ["STABILIZE", "RTH"]);
    expect(analyseRun(s, { build: benchBuild }).summary.failsafe).toMatchObject({
      result: "pass",
      flown: { state: "seen", by: "mode", action: "return-to-home", latencyS: expect.closeTo(0.6, 9), mode: "RTH" },
    });
  });

  it("with an RSSI column instead of channel 14 still passes on the command (no wrong action)", () => {
    const s = bench({ rssiPct: (i) => (i >= 100 && i < 200 ? 0 : 95) });
    const f = analyseRun(s, { build: benchBuild }).summary.failsafe;
    expect(f.result).toBe("pass");
    expect(f.flown).toEqual({ state: "not-logged" });
    expect(analyseRun(s, { build: benchBuild }).summary.link).toMatchObject({ source: { kind: "column" }, note: expect.stringMatching(/channel 14/) });
  });
});

describe("analyseRun without link data (a GPX-like track)", () => {
  const p = walk([[0, 0], [100, 0]], 3, 10);
  const s = makeSeries(p.e.length, { ...toLatLon(p.e, p.n), altM: () => 5 });

  it("says the link and the failsafe were not assessed, and never that the link held", () => {
    const v = analyseRun(s).summary.verdict;
    expect(v.level).toBe("clear");
    expect(v.reasons).toEqual([]);
    expect(v.notAssessed.map((g) => g.what)).toEqual(["link", "failsafe", "route", "battery"]);
    expect(v.notAssessed[0].why).toMatch(/no link metric/);
    // Without a link metric, "no loss" is not evidence: the failsafe's reason says the loss cannot be seen.
    expect(v.notAssessed[1].why).toMatch(/no link metric, so a link loss/);
    expect(analyseRun(s).summary.failsafe.why).toBe(v.notAssessed[1].why); // the figure says the same
    expect(v.held).toEqual(["gps"]);
  });
});

describe("assessmentGaps", () => {
  const base = { linkMetric: "lq", linkNote: null, hasBuild: true, benchLoss: false, failsafeResult: "pass", failsafeWhy: null, hasPlan: true, bench: false, hasVoltage: true, cells: 4 };
  it("lists nothing when everything could be assessed", () => {
    expect(assessmentGaps(base)).toEqual([]);
  });
  it("names each missing piece of evidence", () => {
    expect(assessmentGaps({ ...base, linkMetric: null, linkNote: "The link sheet names channel 9 for RSSI, but the log carries no values on it" })).toEqual([
      { what: "link", why: "The link sheet names channel 9 for RSSI, but the log carries no values on it" },
    ]);
    expect(assessmentGaps({ ...base, cells: null })).toEqual([{ what: "battery", why: "the cell count is unknown: set it on the build" }]);
    expect(assessmentGaps({ ...base, bench: true }).map((g) => g.what)).toEqual(["route", "gps"]);
    expect(assessmentGaps({ ...base, failsafeResult: "not-assessed", failsafeWhy: "x" })).toEqual([{ what: "failsafe", why: "x" }]);
    expect(assessmentGaps({ ...base, bench: true, benchLoss: true }).map((g) => g.what)).toEqual(["link", "route", "gps"]);
  });
});

describe("runDuration and untimed runs", () => {
  it("is never negative: a clock that steps back gives the span of its times", () => {
    expect(runDuration([0, 10, -11_925, 5])).toBe(11_935);
    expect(runDuration([5, 5, 5])).toBe(0);
    expect(runDuration([])).toBe(0);
    expect(runDuration([100, 0, 50, 60], 2)).toBe(10);
  });

  it("gives an untimed run its distance and map but no time figures", () => {
    const p = walk([[0, 0], [100, 0]], 5, 1);
    const { lat, lon } = toLatLon(p.e, p.n);
    const s = makeSeries(lat.length, { lat, lon, sats: () => 10, fixType: () => 3, hdop: () => 0.8 }, { hz: 1 });
    const { summary } = analyseRun(s, { timesUsable: false });
    expect(summary.durationS).toBeNull();
    expect(summary.maxSpeedMps).toBeNull();
    expect(summary.track.movingS).toBeNull();
    expect(summary.timing).toEqual({ usable: false, why: NO_TIMES_WHY });
    expect(summary.distanceM).toBeCloseTo(100, 0);
    expect(summary.timelineS).toBe(lat.length - 1);
    expect(summary.home).not.toBeNull();
  });
});
