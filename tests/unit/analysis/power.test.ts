import { describe, expect, it } from "vitest";
import { analysePower, centredMean, guessCells, integrateMah } from "@/lib/analysis/power";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { frozenCopy, makeSeries } from "@/tests/helpers/series";

// Every series here is synthetic, written for these tests (our own data). 10 Hz unless stated.
// LiPo per-cell limits (3.3–4.35 V, 3.8 V nominal, 3.5 V low) are common practice, not a source.
const th = defaultThresholds("multirotor"); // 3.5 V/cell for ≥ 2 s, on a 1 s centred mean
/** The same without the smoothing window: step edges stay exact for the duration tests. */
const raw = { ...th, lowVoltageWindowS: 0 };
const build3s = { vehicleType: "multirotor" as const, cells: 3 };

describe("guessCells", () => {
  it("picks the count whose volts per cell fit 3.3–4.35 V, nearest 3.8 V", () => {
    expect(guessCells(3.9)).toBe(1);
    expect(guessCells(8.4)).toBe(2);
    expect(guessCells(12.6)).toBe(3);
    expect(guessCells(11.1)).toBe(3);
    expect(guessCells(16.8)).toBe(4); // 4.2 V/cell beats 5S at 3.36 V/cell
    expect(guessCells(22.2)).toBe(6);
  });

  it("reads full, nominal and nearly empty packs by the ⌈V / 4.35⌉ rule (common practice)", () => {
    expect(guessCells(25.2)).toBe(6); // 6S full, 4.2 V/cell
    expect(guessCells(22.2)).toBe(6); // 6S nominal
    expect(guessCells(16.8)).toBe(4);
    expect(guessCells(14.0)).toBe(4); // 4S at 3.5 V/cell
    expect(guessCells(12.6)).toBe(3);
    expect(guessCells(8.7)).toBe(2); // 2S high-voltage LiPo full
  });

  it("accepts the range ends exactly and returns null when nothing fits", () => {
    expect(guessCells(4.35)).toBe(1);
    expect(guessCells(3.3)).toBe(1);
    expect(guessCells(3.29)).toBeNull();
    expect(guessCells(0)).toBeNull();
    expect(guessCells(NaN)).toBeNull();
  });
});

describe("integrateMah", () => {
  it("gives 1000 mAh for 10 A over 360 s (by hand: 3600 A·s = 1 Ah)", () => {
    expect(integrateMah([0, 360], [10, 10])).toBeCloseTo(1000, 9);
    const t = Array.from({ length: 361 }, (_, i) => i);
    expect(integrateMah(t, t.map(() => 10))).toBeCloseTo(1000, 9);
  });

  it("is exact for a linear ramp (trapezoids): 0 → 10 A over 360 s = 500 mAh", () => {
    const t = Array.from({ length: 7 }, (_, i) => i * 60);
    expect(integrateMah(t, t.map((s) => s / 36))).toBeCloseTo(500, 9);
  });

  it("bridges missing samples and returns null with fewer than two currents", () => {
    expect(integrateMah([0, 180, 360], [10, NaN, 10])).toBeCloseTo(1000, 9);
    expect(integrateMah([0], [10])).toBeNull();
    expect(integrateMah([], [])).toBeNull();
  });
});

describe("analysePower", () => {
  // 3S: resting 12.6 V at 0.5 A for 2 s, then 20 A with the pack at 11.4 V, dipping to 11.1 V at 3.0 s.
  const flight = () =>
    makeSeries(60, {
      voltageV: (i) => (i < 20 ? 12.6 : i === 30 ? 11.1 : 11.4),
      currentA: (i) => (i < 20 ? 0.5 : 20),
    });

  it("guesses the cells from the resting voltage and measures sag under load", () => {
    const r = analysePower(flight(), th);
    expect(r).toMatchObject({ cells: 3, cellsFrom: "guessed", restingV: 12.6, minUnderLoadV: 11.1, events: [] });
    expect(r.restingPerCellV).toBeCloseTo(4.2, 12);
    expect(r.minUnderLoadPerCellV).toBeCloseTo(3.7, 12);
    expect(r.sagV).toBeCloseTo(1.5, 12);
    expect(r.sagPerCellV).toBeCloseTo(0.5, 12);
  });

  it("takes the build's cell count over the guess", () => {
    expect(analysePower(flight(), th, { vehicleType: "multirotor", cells: 4 })).toMatchObject({ cells: 4, cellsFrom: "build" });
  });

  it("takes the resting voltage from disarmed samples when no current is logged", () => {
    const s = makeSeries(40, { voltageV: (i) => (i < 10 ? 10.8 : i < 20 ? 16.6 : 15.2), armed: (i) => (i < 10 ? 1 : i < 20 ? 0 : 1) });
    const r = analysePower(s, th);
    expect(r).toMatchObject({ restingV: 16.6, cells: 4, minUnderLoadV: 10.8 });
  });

  it("uses the median of the first 2 s of resting samples", () => {
    // Resting 0–2 s: 12.0, 12.2, 12.4 … ; a later rest at 8 V is ignored.
    const s = makeSeries(50, { voltageV: (i) => (i <= 20 ? 12 + (i % 3) * 0.2 : 8), currentA: () => 0 });
    expect(analysePower(s, th).restingV).toBeCloseTo(12.2, 12);
  });

  it("reports the last logged capacity, else integrates current", () => {
    const logged = makeSeries(5, { currentA: () => 10, usedMah: [0, 10, 20, NaN, NaN] });
    expect(analysePower(logged, th)).toMatchObject({ usedMah: 20, usedMahFrom: "logged" });
    const integrated = makeSeries(361, { currentA: () => 10 }, { hz: 1 });
    const r = analysePower(integrated, th);
    expect(r.usedMahFrom).toBe("integrated");
    expect(r.usedMah).toBeCloseTo(1000, 9);
    expect(analysePower(makeSeries(5), th)).toMatchObject({ usedMah: null, usedMahFrom: null });
  });

  it("fires low-voltage for exactly lowVoltageMinS (2 s) below 3.5 V/cell, with its peak and threshold", () => {
    // 3.4 V/cell (10.2 V) over samples 20–39, 3.3 V/cell at sample 25: 2.0–4.0 s.
    const s = makeSeries(60, { voltageV: (i) => (i === 25 ? 9.9 : i >= 20 && i < 40 ? 10.2 : 11.7), currentA: () => 10 });
    const r = analysePower(s, raw, build3s);
    expect(r.events).toHaveLength(1);
    expect(r.events[0]).toMatchObject({ kind: "low-voltage", startS: 2, endS: 4, threshold: 3.5, detail: { unit: "V/cell", cells: 3 } });
    expect(r.events[0].peak).toBeCloseTo(3.3, 12);
  });

  it("does not fire for 1.9 s below, nor exactly at 3.5 V/cell", () => {
    const short = makeSeries(60, { voltageV: (i) => (i >= 20 && i < 39 ? 10.2 : 11.7) });
    expect(analysePower(short, raw, build3s).events).toEqual([]);
    const atThreshold = makeSeries(60, { voltageV: () => 10.5 }); // 10.5 / 3 = 3.5 exactly
    expect(analysePower(atThreshold, th, build3s).events).toEqual([]);
  });

  it("keeps a low-voltage span over missing samples but not over a reception gap", () => {
    const gappy = makeSeries(60, { voltageV: (i) => (i >= 20 && i < 40 ? (i % 4 === 0 ? 10.2 : NaN) : 11.7) });
    expect(analysePower(gappy, raw, build3s).events.map((e) => [e.startS, e.endS])).toEqual([[2, 4]]);
    const split = makeSeries(60, { voltageV: (i) => (i >= 20 && i < 40 ? 10.2 : 11.7), segmentStart: (i) => (i === 0 || i === 30 ? 1 : 0) });
    expect(analysePower(split, raw, build3s).events).toEqual([]);
  });

  // DESIGN.md §10 "Noise": loaded pack voltage jitters by tens of mV. 3S pack falling linearly
  // through 10.5 V (3.5 V/cell) at exactly 20.0 s, ±60 mV alternating jitter (our own data).
  it("starts low voltage where the mean crosses the limit, not at the first jittery dip", () => {
    const n = 400; // 40 s at 10 Hz
    const v = (i: number) => 10.5 - 0.02 * (i / 10 - 20) + (i % 2 ? 0.06 : -0.06);
    const s = makeSeries(n, { voltageV: v, currentA: () => 15 });
    const smooth = analysePower(s, th, build3s);
    expect(smooth.events).toHaveLength(1);
    // The 1 s centred mean of a line is the line (the jitter cancels): the crossing is 20.0 s ± one sample.
    expect(Math.abs(smooth.events[0].startS - 20)).toBeLessThanOrEqual(0.1 + 1e-9);
    expect(smooth.events[0].detail).toMatchObject({ windowS: 1 });
    // Judged sample by sample, the +60 mV samples end every span from 17 s on until they too fall
    // below after 23 s: the start moves by the jitter's 3 s of decline.
    const jittery = analysePower(s, raw, build3s);
    expect(jittery.events[0].startS).toBeCloseTo(23, 6);
  });

  it("centredMean averages the values in [t − w/2, t + w/2) around each sample, skipping missing ones", () => {
    // windows [t − 0.5, t + 0.5): {0}, {0, 0.5}, {0.5, 1}, {1, 1.5}
    expect(Array.from(centredMean([0, 0.5, 1, 1.5], [4, 2, 4, 2], 1))).toEqual([4, 3, 3, 3]);
    expect(Array.from(centredMean([0, 1, 2], [1, NaN, 3], 4.5))).toEqual([2, NaN, 2]);
    expect(Array.from(centredMean([0, 1], [5, 6], 0))).toEqual([5, 6]);
  });

  it("has no low-voltage events when the cell count is unknown", () => {
    const r = analysePower(makeSeries(60, { voltageV: () => 2 }), th);
    expect(r).toMatchObject({ cells: null, cellsFrom: null, restingPerCellV: null, events: [] });
  });

  it("handles an empty series and one sample", () => {
    expect(analysePower(makeSeries(0), th)).toEqual({
      cells: null, cellsFrom: null, restingV: null, restingPerCellV: null, minUnderLoadV: null, minUnderLoadPerCellV: null,
      sagV: null, sagPerCellV: null, usedMah: null, usedMahFrom: null, events: [],
    });
    expect(analysePower(makeSeries(1, { voltageV: [12.6], currentA: [5] }), th)).toMatchObject({ restingV: 12.6, cells: 3, minUnderLoadV: 12.6, usedMah: null });
  });

  it("leaves its input untouched (frozen copy gives the same result)", () => {
    const s = flight();
    const before = Array.from(s.voltageV);
    expect(analysePower(frozenCopy(s), th, build3s)).toEqual(analysePower(s, th, build3s));
    expect(Array.from(s.voltageV)).toEqual(before);
  });
});
