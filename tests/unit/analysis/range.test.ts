import { describe, expect, it } from "vitest";
import { freeSpaceLossDb } from "@/lib/analysis/free-space-loss";
import { linearFit } from "@/lib/analysis/linear-fit";
import { fitDoubt, PLAUSIBLE_EXPONENT, RANGE_LABEL, RANGE_MIN_R2, RANGE_MIN_SAMPLES, estimateRange, pathLossExponentFixedReference } from "@/lib/analysis/range";

/*
 * Synthetic runs: OUR OWN data, generated here from a known P0 and n with deterministic noise
 * (mulberry32, fixed seed; Box–Muller normal), so the expected values are the generating ones.
 */
function mulberry32(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
function syntheticRun(opts: { p0: number; n: number; sigmaDb: number; count: number; fromM: number; toM: number; seed: number }) {
  const rand = mulberry32(opts.seed);
  const d = new Float64Array(opts.count);
  const rssi = new Float64Array(opts.count);
  for (let i = 0; i < opts.count; i++) {
    d[i] = opts.fromM * (opts.toM / opts.fromM) ** (i / (opts.count - 1)); // outbound leg, log-spaced
    const g = Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
    rssi[i] = opts.p0 - 10 * opts.n * Math.log10(d[i]) + opts.sigmaDb * g;
  }
  return { d, rssi };
}
const exactRun = (p0: number, n: number, count: number, fromM = 20, toM = 400) =>
  syntheticRun({ p0, n, sigmaDb: 0, count, fromM, toM, seed: 1 });
const OPTS = { sensitivityDbm: -112, fadeMarginDb: 10 };

describe("estimateRange", () => {
  it("recovers n within 0.1 and the range within 10 % from a noisy synthetic run (P0 −11 dBm, n 2.8, σ 4 dB)", () => {
    const trueRange = 10 ** ((-11 - -102) / 28); // threshold −112 + 10 = −102 dBm → ≈ 1778 m
    for (const seed of [20240611, 1, 2, 3]) {
      const { d, rssi } = syntheticRun({ p0: -11, n: 2.8, sigmaDb: 4, count: 400, fromM: 15, toM: 1000, seed });
      const r = estimateRange(rssi, d, OPTS);
      expect(r.reason).toBeNull();
      expect(Math.abs(r.estimate!.pathLossExponent - 2.8)).toBeLessThan(0.1);
      expect(Math.abs(r.estimate!.estimatedRangeM! / trueRange - 1)).toBeLessThan(0.1);
      expect(r.estimate!.label).toBe(RANGE_LABEL);
    }
  });

  it("returns P0 and n exactly, R² 1 and the margin at the farthest point, for noiseless data", () => {
    const { d, rssi } = exactRun(-40, 3, 50);
    const e = estimateRange(rssi, d, { sensitivityDbm: -105, fadeMarginDb: 10 }).estimate!;
    expect(e.pathLossExponent).toBeCloseTo(3, 10);
    expect(e.p0Dbm).toBeCloseTo(-40, 9);
    expect(e.r2).toBeCloseTo(1, 12);
    expect(e.samples).toBe(50);
    expect(e.farthestM).toBeCloseTo(400, 9);
    expect(e.thresholdDbm).toBe(-95);
    expect(e.marginAtFarthestDb).toBeCloseTo(-40 - 30 * Math.log10(400) + 95, 9); // −23.06 dB: past the range
    expect(e.estimatedRangeM).toBeCloseTo(10 ** (55 / 30), 6); // ≈ 68.1 m
  });

  it("puts the fit exactly on the threshold at estimatedRangeM (identity)", () => {
    const { d, rssi } = syntheticRun({ p0: -20, n: 2.5, sigmaDb: 3, count: 200, fromM: 12, toM: 600, seed: 7 });
    const e = estimateRange(rssi, d, OPTS).estimate!;
    expect(e.p0Dbm - 10 * e.pathLossExponent * Math.log10(e.estimatedRangeM!)).toBeCloseTo(e.thresholdDbm, 9);
  });

  it("leaves out samples within minDistanceM of home and samples where the link was down", () => {
    const { d, rssi } = exactRun(-30, 2.5, 40);
    const near = [0, 3, 10]; // receiver saturated at home: would spoil the fit
    const down = [-130, -130]; // link down: RSSI at the floor
    const dAll = [...near, ...d, 500, 700];
    const rAll = [0, 0, 0, ...rssi, ...down];
    const linked = [1, 1, 1, ...Array.from(d, () => 1), 0, NaN];
    const e = estimateRange(rAll, dAll, { ...OPTS, linked }).estimate!;
    expect(e.samples).toBe(40);
    expect(e.pathLossExponent).toBeCloseTo(2.5, 10);
    expect(e.nearestM).toBeCloseTo(20, 9);
    expect(estimateRange(rAll, dAll, { ...OPTS, linked, minDistanceM: 50 }).estimate!.nearestM).toBeGreaterThan(50);
  });

  it("skips NaN RSSI and NaN distance", () => {
    const { d, rssi } = exactRun(-30, 2.5, 30);
    const e = estimateRange([...rssi, NaN, -60], [...d, 200, NaN], OPTS).estimate!;
    expect(e.samples).toBe(30);
  });

  it(`refuses with ${RANGE_MIN_SAMPLES - 1} usable samples and accepts ${RANGE_MIN_SAMPLES}`, () => {
    const few = exactRun(-30, 2.5, RANGE_MIN_SAMPLES - 1);
    const r = estimateRange(few.rssi, few.d, OPTS);
    expect(r.estimate).toBeNull();
    expect(r.reason).toMatch(/Too few .* 19, need 20/);
    const enough = exactRun(-30, 2.5, RANGE_MIN_SAMPLES);
    expect(estimateRange(enough.rssi, enough.d, OPTS).estimate).not.toBeNull();
  });

  it("refuses empty input", () => {
    expect(estimateRange([], [], OPTS)).toEqual({ estimate: null, reason: expect.stringMatching(/0, need 20/) });
  });

  it("refuses when the farthest sample is less than twice the nearest", () => {
    const { d, rssi } = exactRun(-30, 2.5, 100, 100, 190);
    const r = estimateRange(rssi, d, OPTS);
    expect(r.estimate).toBeNull();
    expect(r.reason).toMatch(/100–190 m/);
  });

  it("gives no range when RSSI does not fall with distance (n ≤ 0)", () => {
    const { d, rssi } = exactRun(-80, -0.5, 30);
    const e = estimateRange(rssi, d, OPTS).estimate!;
    expect(e.pathLossExponent).toBeLessThan(0);
    expect(e.estimatedRangeM).toBeNull();
    const flat = estimateRange(new Float64Array(30).fill(-70), exactRun(0, 2, 30).d, OPTS).estimate!;
    expect(flat.pathLossExponent).toBeCloseTo(0, 12);
    expect(flat.estimatedRangeM).toBeNull();
  });

  it("reports a free-space reference through the same P0 that matches the fit when n = 2", () => {
    const { d, rssi } = exactRun(-25, 2, 60, 20, 900);
    const e = estimateRange(rssi, d, { ...OPTS, bandMhz: 868 }).estimate!;
    expect(e.freeSpace!.lossAtFarthestDb).toBeCloseTo(freeSpaceLossDb(868, 900), 9);
    expect(e.freeSpace!.rangeM).toBeCloseTo(e.estimatedRangeM!, 6);
    expect(e.freeSpace!.rangeM).toBeCloseTo(10 ** ((-25 + 102) / 20), 6);
    expect(estimateRange(rssi, d, OPTS).estimate!.freeSpace).toBeNull();
  });

  it("does not mutate its inputs", () => {
    const { d, rssi } = exactRun(-30, 2.5, 30);
    const dCopy = Float64Array.from(d);
    const rCopy = Float64Array.from(rssi);
    const linked = Object.freeze(Array.from(d, () => 1));
    estimateRange(rssi, d, { ...OPTS, linked });
    expect(d).toEqual(dCopy);
    expect(rssi).toEqual(rCopy);
  });

  it("throws on arrays of different length or a non-finite threshold", () => {
    expect(() => estimateRange([1, 2], [1], OPTS)).toThrow(/equal length/);
    expect(() => estimateRange([1], [1], { ...OPTS, linked: [1, 1] })).toThrow(/linked/);
    expect(() => estimateRange([1], [1], { sensitivityDbm: NaN, fadeMarginDb: 10 })).toThrow(/finite/);
  });
});

/*
 * Rappaport, Wireless Communications: Principles and Practice, 2nd ed., Example 4.9 (quoted
 * from memory): powers 0, −20, −35, −70 dBm at 100 m, 200 m, 1 km, 3 km, d0 = 100 m, P(d0) = 0 dBm
 * measured. The book: J(n) = 6525 − 2887.8·n + 327.153·n², MMSE n = 4.4, σ² = J(4.4)/4 = 38.09,
 * σ = 6.17 dB. Exact arithmetic gives n = 4.413 and σ = 6.157 dB (6.158 at n = 4.4): the book's
 * 6.17 comes from its rounded J coefficients, hence a 0.02 dB tolerance on σ.
 */
const BOOK_D = [100, 200, 1000, 3000];
const BOOK_P = [0, -20, -35, -70];

describe("pathLossExponentFixedReference", () => {
  it("gives Rappaport Example 4.9's MMSE n = 4.4 and σ ≈ 6.17 dB with the reference fixed at d0", () => {
    const r = pathLossExponentFixedReference(BOOK_D, BOOK_P, 100, 0);
    expect(r.pathLossExponent).toBeCloseTo(4.4, 1);
    expect(r.pathLossExponent).toBeCloseTo(144.419 / 32.725, 3); // Σ(p0 − pᵢ)xᵢ / (10·Σxᵢ²) by hand
    expect(Math.abs(r.sigmaDb - 6.17)).toBeLessThan(0.02);
    expect(r.samples).toBe(4);
  });

  it("differs from estimateRange's free-intercept fit of the same points, which moves P(d0) off 0 dBm", () => {
    // Our estimator's model on the book's four points (too few for estimateRange, so linearFit
    // directly). Values computed here, not from the book: n = 4.289, P(1 m) = 84.32 dBm,
    // P(100 m) = −1.46 dBm, residual RMS 6.09 dB — a free P0 buys a smaller n and a smaller σ.
    const free = linearFit(BOOK_D.map(Math.log10), BOOK_P);
    const n = -free.slope / 10;
    expect(n).toBeCloseTo(4.289, 3);
    expect(free.intercept).toBeCloseTo(84.32, 2);
    expect(free.intercept - 10 * n * 2).toBeCloseTo(-1.46, 2);
    expect(n).toBeLessThan(pathLossExponentFixedReference(BOOK_D, BOOK_P, 100, 0).pathLossExponent);
  });

  it("skips NaN samples and throws without a sample away from d0", () => {
    expect(pathLossExponentFixedReference([...BOOK_D, NaN], [...BOOK_P, -50], 100, 0).samples).toBe(4);
    expect(() => pathLossExponentFixedReference([100, 100], [0, -1], 100, 0)).toThrow(/away from d0M/);
    expect(() => pathLossExponentFixedReference([100], [0, 1], 100, 0)).toThrow(/equal length/);
    expect(() => pathLossExponentFixedReference(BOOK_D, BOOK_P, 0, 0)).toThrow(/positive d0M/);
  });
});

describe("fitDoubt: when a fit is not quoted as a range", () => {
  it(`accepts R² ≥ ${RANGE_MIN_R2} with n inside Rappaport Table 4.2's 1.6–6 (from memory; bounds ${PLAUSIBLE_EXPONENT.min}–${PLAUSIBLE_EXPONENT.max})`, () => {
    expect(fitDoubt(0.9, 2)).toBeNull();
    expect(fitDoubt(RANGE_MIN_R2, PLAUSIBLE_EXPONENT.max)).toBeNull();
  });

  it("refuses a fit that explains little of the signal, and an exponent no real link shows", () => {
    expect(fitDoubt(0.04, 0.6)).toMatch(/explains only 4 % .*R² 0\.04, need 0\.5/);
    expect(fitDoubt(0.8, 0.7)).toMatch(/exponent 0\.70 is outside the 1\.5–6/);
    expect(fitDoubt(0.8, 9)).toMatch(/exponent 9\.00/);
  });

  it("marks a noisy run's estimate not credible, keeping the line for the range view", () => {
    const { rssi, d } = syntheticRun({ p0: -40, n: 3, sigmaDb: 40, count: 400, fromM: 20, toM: 60, seed: 7 });
    const e = estimateRange(rssi, d, OPTS).estimate!;
    expect(e.r2).toBeLessThan(RANGE_MIN_R2);
    expect(e.credible).toBe(false);
    expect(e.notCredibleWhy).toMatch(/R²/);
    expect(e.pathLossExponent).not.toBeNaN();
  });
});
