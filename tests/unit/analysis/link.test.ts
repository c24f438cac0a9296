import { describe, expect, it } from "vitest";
import { analyseLink } from "@/lib/analysis/link";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { frozenCopy, makeSeries, rcColumn } from "@/tests/helpers/series";

// Every series here is synthetic, written for these tests (our own data). 10 Hz: sample i at i/10 s.
const th = defaultThresholds("ground"); // LQ 70 %, RSSI 40 %, −100 dBm + 10 dB, 0.5 s, 5 pt / 3 dB, 0.1 s
/** LQ 100 % except `value` over samples [from, to). */
const dip = (n: number, from: number, to: number, value: number) => (i: number) => (i >= from && i < to ? value : 100);
const kinds = (r: ReturnType<typeof analyseLink>) => r.events.map((e) => e.kind);

describe("analyseLink", () => {
  it("fires one link-fade from the first low sample to the first recovered one, and nothing else", () => {
    const r = analyseLink(makeSeries(30, { lqPct: dip(30, 10, 20, 50) }), th);
    expect(r.events).toHaveLength(1);
    expect(r.events[0]).toMatchObject({ kind: "link-fade", startS: 1, endS: 2, peak: 50, threshold: 70 });
    expect(r.events[0].detail).toMatchObject({ metric: "lq", unit: "%", exitThreshold: 75 });
    expect(r.summary).toMatchObject({ metric: "lq", fadeCount: 1, lostCount: 0, fadeThreshold: 70, exitThreshold: 75 });
  });

  it("does not fade exactly at the threshold, and fades just below it", () => {
    expect(analyseLink(makeSeries(30, { lqPct: dip(30, 10, 20, 70) }), th).events).toEqual([]);
    expect(kinds(analyseLink(makeSeries(30, { lqPct: dip(30, 10, 20, 69.9) }), th))).toEqual(["link-fade"]);
  });

  it("keeps a fade of exactly fadeMinS (0.5 s) and drops one of 0.4 s", () => {
    expect(analyseLink(makeSeries(30, { lqPct: dip(30, 10, 15, 50) }), th).events[0]).toMatchObject({ startS: 1, endS: 1.5 });
    expect(analyseLink(makeSeries(30, { lqPct: dip(30, 10, 14, 50) }), th).events).toEqual([]);
  });

  it("does not end a fade on a rise 2 points above the threshold, but does on 6 points (hysteresis 5)", () => {
    // 50 % for 1.0–1.5 s, then `mid` for 1.5–2.0 s, 50 % for 2.0–2.5 s, then 100 %.
    const lq = (mid: number) => (i: number) => (i >= 10 && i < 15 ? 50 : i >= 15 && i < 20 ? mid : i >= 20 && i < 25 ? 50 : 100);
    const held = analyseLink(makeSeries(40, { lqPct: lq(72) }), th);
    expect(held.events.map((e) => [e.startS, e.endS])).toEqual([[1, 2.5]]);
    const ended = analyseLink(makeSeries(40, { lqPct: lq(76) }), th);
    expect(ended.events.map((e) => [e.startS, e.endS])).toEqual([[1, 1.5], [2, 2.5]]);
    // Exactly threshold + hysteresis (75) ends it too.
    expect(analyseLink(makeSeries(40, { lqPct: lq(75) }), th).events).toHaveLength(2);
  });

  it("fires link-lost for LQ 0 held exactly lostMinS (one sample at 10 Hz), not for a shorter one", () => {
    const r = analyseLink(makeSeries(30, { lqPct: dip(30, 10, 11, 0) }), th);
    expect(r.events).toHaveLength(1); // 0.1 s is too short for a fade
    expect(r.events[0]).toMatchObject({ kind: "link-lost", startS: 1, endS: 1.1, peak: 0, threshold: 0 });
    expect(r.events[0].detail).toMatchObject({ causes: ["floor"] });
    expect(analyseLink(makeSeries(60, { lqPct: dip(60, 20, 21, 0) }, { hz: 20 }), th).events).toEqual([]); // 0.05 s
  });

  // DESIGN.md §10 "One incident, one event": the fade that runs into a loss is the loss's lead-in.
  it("folds a fade that runs into a loss into the loss event, keeping the fade's onset and recovery", () => {
    const lq = (i: number) => (i >= 15 && i < 20 ? 0 : i >= 10 && i < 30 ? 40 : 100);
    const r = analyseLink(makeSeries(40, { lqPct: lq }), th);
    expect(r.events.map((e) => [e.kind, e.startS, e.endS, e.peak])).toEqual([["link-lost", 1.5, 2, 0]]);
    expect(r.events[0].detail).toMatchObject({ fadeStartS: 1, fadeEndS: 3 });
    expect(r.summary).toMatchObject({ fadeCount: 0, lostCount: 1 });
    expect(r.summary.timeLostS).toBeCloseTo(0.5, 12);
  });

  it("keeps a fade apart from a loss it does not touch, and gives a loss with no fade around it no lead-in", () => {
    // fade 1.0–2.0 s (LQ 50), recovered, then LQ straight to 0 from 3.0 to 3.5 s
    const lq = (i: number) => (i >= 10 && i < 20 ? 50 : i >= 30 && i < 35 ? 0 : 100);
    const r = analyseLink(makeSeries(50, { lqPct: lq }), th);
    expect(r.events.map((e) => [e.kind, e.startS, e.endS])).toEqual([
      ["link-fade", 1, 2],
      ["link-lost", 3, 3.5],
    ]);
    expect(r.events[1].detail).not.toHaveProperty("fadeStartS");
    expect(r.summary).toMatchObject({ fadeCount: 1, lostCount: 1 });
  });

  it("fires link-lost while the failsafe flag is raised even with a good metric", () => {
    const r = analyseLink(makeSeries(30, { lqPct: () => 90, failsafe: (i) => (i >= 5 && i < 8 ? 1 : 0) }), th);
    expect(r.events).toHaveLength(1);
    expect(r.events[0]).toMatchObject({ kind: "link-lost", startS: 0.5, endS: 0.8, peak: 90, threshold: null });
    expect(r.events[0].detail.causes).toEqual(["failsafe-flag"]);
  });

  it("treats a missing metric as lost only while armed and other fields keep coming", () => {
    const lq = (i: number) => (i >= 10 && i < 15 ? NaN : 100);
    const armed = analyseLink(makeSeries(30, { lqPct: lq, armed: () => 1, voltageV: () => 12 }), th);
    expect(armed.events.map((e) => [e.kind, e.startS, e.endS, e.peak])).toEqual([["link-lost", 1, 1.5, null]]);
    expect(armed.events[0].detail.causes).toEqual(["no-metric"]);
    expect(analyseLink(makeSeries(30, { lqPct: lq, armed: () => 0, voltageV: () => 12 }), th).events).toEqual([]);
    expect(analyseLink(makeSeries(30, { lqPct: lq, armed: () => 1 }), th).events).toEqual([]);
  });

  it("does not call a link column logged at a lower rate than the other fields lost", () => {
    const sparse = (i: number) => (i % 10 === 0 ? 100 : NaN); // LQ at 1 Hz, rows at 10 Hz
    expect(analyseLink(makeSeries(50, { lqPct: sparse, armed: () => 1, voltageV: () => 12 }), th).events).toEqual([]);
  });

  it("prefers LQ, then RSSI %, then RSSI dBm, with each metric's threshold", () => {
    const all = makeSeries(5, { lqPct: () => 90, rssiPct: () => 50, rssiDbm: () => -80 });
    expect(analyseLink(all, th).summary.metric).toBe("lq");
    const pct = analyseLink(makeSeries(5, { rssiPct: () => 50, rssiDbm: () => -80 }), th).summary;
    expect(pct).toMatchObject({ metric: "rssi-pct", unit: "%", fadeThreshold: 40, exitThreshold: 45 });
    const dbm = analyseLink(makeSeries(5, { rssiDbm: () => -80 }), th).summary;
    expect(dbm).toMatchObject({ metric: "rssi-dbm", unit: "dBm", fadeThreshold: -90, exitThreshold: -87 });
    const sens = analyseLink(makeSeries(5, { rssiDbm: () => -80 }), th, { vehicleType: "ground", rxSensitivityDbm: -105 }).summary;
    expect(sens.fadeThreshold).toBe(-95);
    expect(analyseLink(makeSeries(5), th).summary.metric).toBeNull();
  });

  it("ends a dBm fade only 3 dB above sensitivity + margin", () => {
    const dbm = (i: number) => (i >= 10 && i < 20 ? -95 : i >= 20 && i < 25 ? -88 : -70); // −88 is 2 dB above −90
    const r = analyseLink(makeSeries(40, { rssiDbm: dbm }), th);
    expect(r.events.map((e) => [e.kind, e.startS, e.endS, e.peak, e.threshold])).toEqual([["link-fade", 1, 2.5, -95, -90]]);
  });

  it("matches R's quantile type 7 for the 5th percentile and simple-statistics' documented median", () => {
    // simple-statistics quantileSorted JSDoc: median of [3, 6, 7, 8, 8, 9, 10, 13, 15, 16, 20] is 9.
    // R, type 7 (Hyndman & Fan 1996, The American Statistician 50(4)): h = (11 − 1)·0.05 = 0.5,
    // so p5 = 3 + 0.5·(6 − 3) = 4.5. Order shuffled to prove the values are sorted first.
    const lq = [13, 8, 3, 20, 9, 6, 16, 10, 8, 15, 7];
    const s = analyseLink(makeSeries(11, { lqPct: lq }), th).summary;
    expect(s).toMatchObject({ min: 3, median: 9, p5: 4.5, samples: 11 });
    // By hand for [10, 20, 30, 40, 50]: h = 4·0.05 = 0.2 → 10 + 0.2·10 = 12.
    expect(analyseLink(makeSeries(5, { lqPct: [50, 10, 40, 20, 30] }), th).summary).toMatchObject({ p5: 12, median: 30 });
  });

  it("adds up time below the threshold holding each value until the next one", () => {
    // Low at 1.0–1.9 s (10 samples): each holds 0.1 s until the next value → 1.0 s.
    expect(analyseLink(makeSeries(30, { lqPct: dip(30, 10, 20, 50) }), th).summary.timeBelowThresholdS).toBeCloseTo(1, 12);
    // A missing stretch is held from the value before it: low at 1.0 s, then nothing until 2.0 s.
    const gappy = (i: number) => (i === 10 ? 50 : i > 10 && i < 20 ? NaN : 100);
    expect(analyseLink(makeSeries(30, { lqPct: gappy }), th).summary.timeBelowThresholdS).toBeCloseTo(1, 12);
  });

  it("does not bridge a reception gap with a fade", () => {
    // Low on both sides of a segment start at sample 13: 1.0–1.2 s and 1.3–1.6 s, each shorter than 0.5 s.
    const s = makeSeries(30, { lqPct: dip(30, 10, 16, 50), segmentStart: (i) => (i === 0 || i === 13 ? 1 : 0) });
    expect(analyseLink(s, th).events).toEqual([]);
    expect(analyseLink(s, th).summary.timeBelowThresholdS).toBeCloseTo(0.5, 12);
  });

  it("places each event at its start, with the distance from home when given", () => {
    const s = makeSeries(30, { lqPct: dip(30, 10, 20, 50), lat: (i) => 51 + i / 1000, lon: () => -1 });
    const home = Float64Array.from({ length: 30 }, (_, i) => i * 2);
    expect(analyseLink(s, th, undefined, home).events[0]).toMatchObject({ lat: 51.01, lon: -1, distanceFromHomeM: 20 });
    expect(analyseLink(s, th).events[0].distanceFromHomeM).toBeNull();
  });

  it("marks samples inside a loss in the linked mask", () => {
    const r = analyseLink(makeSeries(6, { lqPct: [100, 0, 0, 100, 100, 100] }), th);
    expect(Array.from(r.linked)).toEqual([1, 0, 0, 1, 1, 1]);
  });

  it("returns empty results for an empty series and for one sample", () => {
    const empty = analyseLink(makeSeries(0), th);
    expect(empty.events).toEqual([]);
    expect(empty.summary).toMatchObject({ metric: null, min: null, median: null, p5: null, timeBelowThresholdS: 0, fadeCount: 0, lostCount: 0, samples: 0 });
    const one = analyseLink(makeSeries(1, { lqPct: [0] }), th);
    expect(one.events).toEqual([]); // a single sample lasts 0 s
    expect(one.summary).toMatchObject({ metric: "lq", min: 0, median: 0, p5: 0, samples: 1 });
  });

  it("leaves its input untouched (frozen copy gives the same result)", () => {
    const s = makeSeries(40, { lqPct: (i) => (i >= 15 && i < 20 ? 0 : i >= 10 && i < 30 ? 40 : 100), armed: () => 1 });
    const before = JSON.stringify(Array.from(s.lqPct));
    const r = analyseLink(s, th);
    expect(analyseLink(frozenCopy(s), th)).toEqual(r);
    expect(JSON.stringify(Array.from(s.lqPct))).toBe(before);
  });

  // DESIGN.md §10 "RSSI often travels on a spare RC channel": 1000–2000 µs = 0–100 % (common practice).
  describe("RSSI from the link sheet's RSSI channel", () => {
    const sheet = (channel: number) => ({ vehicleType: "ground" as const, channels: [{ channel, function: "rssi" }] });
    const rc12 = (us: (i: number) => number, n = 40) => makeSeries(n, { rc: rcColumn(n, { 12: us }), armed: () => 1, voltageV: () => 16 });

    it("reads RSSI % from the channel when the log has no link column, with its source named", () => {
      const r = analyseLink(rc12((i) => (i >= 10 && i < 20 ? 1000 : 1950)), th, sheet(12));
      expect(r.summary).toMatchObject({ metric: "rssi-pct", unit: "%", source: { kind: "rc-channel", channel: 12 }, note: null, lostCount: 1, min: 0, median: 95 });
      expect(r.events.map((e) => [e.kind, e.startS, e.endS])).toEqual([["link-lost", 1, 2]]);
      expect(r.rcRssiPct?.[0]).toBe(95);
      expect(r.rcRssiPct?.[10]).toBe(0);
    });

    it("clamps values outside 1000–2000 µs and treats a missing pulse (0) as no value", () => {
      const r = analyseLink(rc12((i) => (i === 0 ? 2100 : i === 1 ? 900 : i === 2 ? 0 : 1500), 5), th, sheet(12));
      expect(Array.from(r.rcRssiPct!)).toEqual([100, 0, NaN, 50, 50]);
    });

    it("prefers a logged link column and says the sheet's channel was not used", () => {
      const n = 30;
      const s = makeSeries(n, { lqPct: () => 100, rc: rcColumn(n, { 12: () => 1900 }) });
      const r = analyseLink(s, th, sheet(12));
      expect(r.summary).toMatchObject({ metric: "lq", source: { kind: "column" } });
      expect(r.summary.note).toMatch(/channel 12.*LQ column was used/);
      expect(r.rcRssiPct).toBeNull();
    });

    it("has no metric without a sheet channel, and says so when the named channel is empty", () => {
      const s = rc12(() => 1500);
      expect(analyseLink(s, th).summary).toMatchObject({ metric: null, source: null, note: null });
      const r = analyseLink(s, th, sheet(14));
      expect(r.summary).toMatchObject({ metric: null, source: null });
      expect(r.summary.note).toMatch(/channel 14.*no values/);
    });
  });
});
