/**
 * From stored levels to SeriesResponse values (lib/series/decimate.ts, lib/series/read.ts) on
 * synthetic series of our own, checked against brute-force scans of the same arrays. Two x
 * positions per bucket carrying min and max is common practice for drawing large series.
 */
import { describe, expect, it } from "vitest";
import { clampRange, decimateLevel, planRead, rawAsLevel, round7, seqRange } from "@/lib/series/decimate";
import { readPoints, readSeries, readTrack } from "@/lib/series/read";
import { makeSeries } from "../../helpers/series";
import { bruteMinMax, build, rand } from "./stored";

const finite = (a: (number | null)[]) => a.filter((v): v is number => v !== null);

describe("round7", () => {
  it("gives the shortest text of a 32-bit float's decimal", () => {
    expect(round7(Math.fround(-80.3))).toBe(-80.3);
    expect(round7(Math.fround(16.42))).toBe(16.42);
    expect(round7(Math.fround(0.000123))).toBe(0.000123);
    expect(round7(Math.fround(1234567))).toBe(1234567);
    expect(round7(0)).toBe(0);
    expect(round7(NaN)).toBeNaN();
  });
});

describe("decimateLevel", () => {
  const level = {
    size: 4,
    tFirst: [0, 1, 2, 10],
    tLast: [0.9, 1.9, 2.9, 10.9],
    seq: [0, 4, 8, 12],
    endSeq: 16,
    gap: [0, 0, 0, 1],
    // Bucket 1: max first (a fade after a peak); bucket 2: no value.
    values: { rssiDbm: [-80, -70, -60, -90, NaN, NaN, -75, -74] },
  };

  it("emits each bucket's min and max in time order at its first and last time, null where no value", () => {
    const out = decimateLevel(level, { fields: ["rssiDbm"], from: 0, to: 11, points: 100 });
    expect(out.resolution).toBe(4);
    // A null row between 2.9 and 10 for the break before bucket 3.
    expect(out.t).toEqual([0, 0.9, 1, 1.9, 2, 2.9, 6.45, 10, 10.9]);
    expect(out.values.rssiDbm).toEqual([-80, -70, -60, -90, null, null, null, -75, -74]);
  });

  it("merges buckets to fit the points asked for, never across a break", () => {
    const out = decimateLevel(level, { fields: ["rssiDbm"], from: 0, to: 11, points: 2 });
    expect(out.resolution).toBe(16);
    expect(out.t).toEqual([0, 2.9, 6.45, 10, 10.9]);
    // Merged 0–2: max −60 comes before min −90.
    expect(out.values.rssiDbm).toEqual([-60, -90, null, -75, -74]);
  });

  it("keeps only buckets overlapping the range", () => {
    const out = decimateLevel(level, { fields: ["rssiDbm"], from: 1.5, to: 2.5, points: 100 });
    expect(out.t).toEqual([1, 1.9, 2, 2.9]);
  });

  it("passes raw samples through when they fit, with a null row at each break", () => {
    const raw = rawAsLevel({ seq: [0, 1, 2, 3], t: [0, 0.1, 5, 5.1], breakBefore: [0, 0, 1, 0], values: { lqPct: [100, NaN, 90, 80] } });
    const out = decimateLevel(raw, { fields: ["lqPct"], from: 0, to: 6, points: 4 });
    expect(out.resolution).toBe("raw");
    expect(out.t).toEqual([0, 0.1, 2.55, 5, 5.1]);
    expect(out.values.lqPct).toEqual([100, null, null, 90, 80]);
  });
});

describe("read planning", () => {
  const meta = { n: 1_000_000, timeIndexStep: 245, tEnd: 99_999.9, levels: [16, 128, 1024].map((size) => ({ size, count: Math.ceil(1e6 / size), chunkSeq: [0] })) };
  const tIndex = Float64Array.from({ length: Math.ceil(999_999 / 245) + 1 }, (_, k) => Math.min(k * 245, 999_999) / 10);

  it("finds a seq range that holds every sample of the time range", () => {
    const r = seqRange(meta, tIndex, 1000, 1010)!;
    expect(r.lo).toBeLessThanOrEqual(10_000);
    expect(r.hi).toBeGreaterThanOrEqual(10_100);
    expect(r.hi - r.lo).toBeLessThan(100 + 2 * 245 + 1);
  });

  it("reads raw samples for a short range and the finest fitting level otherwise", () => {
    const m = meta as never;
    expect(planRead(m, tIndex, 1000, 1010, 2000).kind).toBe("raw");
    const whole = planRead(m, tIndex, 0, 99_999.9, 2000);
    expect(whole.kind === "level" && meta.levels[whole.level].size).toBe(1024);
    // 100,000 samples at 2000 points: about 780 buckets of 128, two x positions each.
    const tenth = planRead(m, tIndex, 0, 9_999.9, 2000);
    expect(tenth.kind === "level" && meta.levels[tenth.level].size).toBe(128);
  });

  it("clamps the range to the run", () => {
    expect(clampRange({ tEnd: 50 }, -5, 80)).toEqual({ from: 0, to: 50 });
    expect(clampRange({ tEnd: 50 }, undefined, undefined)).toEqual({ from: 0, to: 50 });
  });
});

describe("readSeries over stored levels", () => {
  const n = 300_000;
  const r = rand(7);
  const series = makeSeries(n, {
    rssiDbm: (i) => (r() < 0.05 ? NaN : Math.round((-95 + 40 * Math.sin(i / 3000) + r() * 10) * 10) / 10),
    voltageV: (i) => 16.8 - i / 1e5,
    segmentStart: (i) => (i === 0 || i === 123_457 ? 1 : 0),
  });
  const dist = Float64Array.from({ length: n }, (_, i) => (i < 100 ? NaN : Math.abs(Math.sin(i / 10_000)) * 800));

  it("whole run: at most the points asked for, min and max equal to a scan of the samples", async () => {
    const b = await build(series, { distanceFromHomeM: dist });
    const out = await readSeries(b.source, b.samples, b.loaded, { fields: ["rssiDbm", "distanceFromHomeM", "xteM"], points: 2000 });
    expect(out.absent).toEqual(["xteM"]);
    expect(out.values.xteM).toBeUndefined();
    expect(typeof out.resolution).toBe("number");
    expect(out.t.length).toBeLessThanOrEqual(2000 + 2);
    expect(out.t.length).toBeGreaterThan(1000);
    for (let i = 1; i < out.t.length; i++) expect(out.t[i]).toBeGreaterThanOrEqual(out.t[i - 1]);
    const rssi = finite(out.values.rssiDbm!);
    const want = bruteMinMax(series.rssiDbm, 0, n);
    expect(Math.min(...rssi)).toBe(want.min);
    expect(Math.max(...rssi)).toBe(want.max);
    const d = finite(out.values.distanceFromHomeM!);
    expect(Math.max(...d)).toBe(round7(Math.fround(bruteMinMax(dist, 0, n).max)));
    // The segment start is a null row on every field.
    const gapRows = out.t.map((_, i) => i).filter((i) => out.values.rssiDbm![i] === null && out.values.distanceFromHomeM![i] === null);
    expect(gapRows.some((i) => out.t[i] < series.tS[123_457] && out.t[i] > series.tS[123_456 - 2000])).toBe(true);
    expect(b.samples.calls).toBe(0);
  });

  it("zoomed to a few seconds: the samples themselves", async () => {
    const b = await build(series, { distanceFromHomeM: dist });
    const out = await readSeries(b.source, b.samples, b.loaded, { fields: ["rssiDbm", "distanceFromHomeM"], from: 12_000, to: 12_002, points: 2000 });
    expect(out.resolution).toBe("raw");
    const idx = Array.from({ length: n }, (_, i) => i).filter((i) => series.tS[i] >= 12_000 && series.tS[i] <= 12_002);
    expect(out.t).toEqual(idx.map((i) => series.tS[i]));
    expect(out.values.rssiDbm).toEqual(idx.map((i) => (Number.isNaN(series.rssiDbm[i]) ? null : series.rssiDbm[i])));
    expect(out.values.distanceFromHomeM).toEqual(idx.map((i) => round7(Math.fround(dist[i]))));
  });

  it("a raw read around a break carries its null row", async () => {
    const b = await build(series);
    const tBreak = series.tS[123_457];
    const out = await readSeries(b.source, b.samples, b.loaded, { fields: ["voltageV"], from: tBreak - 0.95, to: tBreak + 0.95, points: 2000 });
    expect(out.resolution).toBe("raw");
    // 9 samples, the null row, 10 samples.
    expect(out.t.length).toBe(20);
    expect(out.values.voltageV![9]).toBeNull();
    expect(out.t[9]).toBeCloseTo(tBreak - 0.05, 6);
  });

  it("a range of a few thousand samples is binned from raw rows, finer than the first level", async () => {
    const b = await build(series);
    const out = await readSeries(b.source, b.samples, b.loaded, { fields: ["rssiDbm"], from: 1000, to: 1300, points: 1000 });
    // 3001 samples into at most 500 buckets.
    expect(out.resolution).toBe(7);
    const lo = 10_000, hi = 13_001;
    const rssi = finite(out.values.rssiDbm!);
    expect(Math.min(...rssi)).toBe(bruteMinMax(series.rssiDbm, lo, hi).min);
    expect(Math.max(...rssi)).toBe(bruteMinMax(series.rssiDbm, lo, hi).max);
  });
});

describe("readPoints and readTrack", () => {
  const n = 100_000;
  const series = makeSeries(n, {
    rssiDbm: (i) => -60 - (i % 40),
    // LQ on one row in 50: the stored sample holds too few, so the exact path is used.
    lqPct: (i) => (i % 50 === 7 ? 100 - (i % 30) : NaN),
    lat: (i) => 53 + i * 1e-7,
    lon: () => -3,
  });
  const dist = Float64Array.from({ length: n }, (_, i) => (i % 2 ? NaN : i / 10));

  it("actual samples where every field has a value, at an even stride, with the exact total", async () => {
    const b = await build(series, { distanceFromHomeM: dist });
    const out = await readPoints(b.source, b.samples, b.loaded, { fields: ["rssiDbm", "distanceFromHomeM"], points: 2000 });
    expect(out.total).toBe(n / 2);
    expect(out.t.length).toBe(2000);
    for (let k = 0; k < out.t.length; k++) {
      const i = Math.round(out.t[k] * 10);
      expect(out.values.rssiDbm![k]).toBe(series.rssiDbm[i]);
      expect(out.values.distanceFromHomeM![k]).toBe(round7(Math.fround(dist[i])));
    }
    expect(b.samples.calls).toBe(0);
  });

  it("falls back to the samples when the stored sample holds too few", async () => {
    const b = await build(series, { distanceFromHomeM: dist });
    const out = await readPoints(b.source, b.samples, b.loaded, { fields: ["lqPct", "rssiDbm"], points: 1500 });
    expect(out.total).toBe(n / 50);
    expect(out.t.length).toBe(1500);
    expect(b.samples.calls).toBe(1);
    for (let k = 0; k < out.t.length; k++) expect(Math.round(out.t[k] * 10) % 50).toBe(7);
    for (let k = 1; k < out.t.length; k++) expect(out.t[k]).toBeGreaterThan(out.t[k - 1]);
  });

  it("nothing when a field has no value in the run", async () => {
    const b = await build(series);
    const out = await readPoints(b.source, b.samples, b.loaded, { fields: ["rssiDbm", "xteM"], points: 100 });
    expect(out).toEqual({ t: [], values: { rssiDbm: [], xteM: [] }, total: 0 });
  });

  it("the track as the endpoint sends it", async () => {
    const b = await build(series);
    const tr = await readTrack(b.source, b.loaded);
    expect(tr.metric).toEqual({ field: "lqPct", unit: "%" });
    expect(tr.t.length).toBe(4000);
    expect(tr.lat.length).toBe(4000);
    expect(tr.link.every((v) => v === null || (v >= 70 && v <= 100))).toBe(true);
    expect(tr.breaks).toEqual([]);
  });
});
