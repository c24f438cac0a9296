import { describe, expect, it } from "vitest";
import { linearRegression, linearRegressionLine, rSquared } from "simple-statistics";
import { linearFit } from "@/lib/analysis/linear-fit";

/*
 * NIST Statistical Reference Datasets, Linear Regression, "Norris" (lower difficulty, 36
 * observations, y = B0 + B1·x), https://www.itl.nist.gov/div898/strd/lls/data/Norris.shtml.
 * Certified: B1 = 1.00211681802045, B0 = -0.262323073774029, R² = 0.999993745883712.
 * The 36 points were written from memory, then compared with independent copies in
 * public test suites (scipy.stats `test_nist_norris`, Apache Commons Math `SimpleRegressionTest`)
 * and found identical; a wrong point would move the certified digits, so the test checks itself.
 */
const NORRIS_X = [
  0.2, 337.4, 118.2, 884.6, 10.1, 226.5, 666.3, 996.3, 448.6, 777.0, 558.2, 0.4, 0.6, 775.5, 666.9, 338.0, 447.5, 11.6,
  556.0, 228.1, 995.8, 887.6, 120.2, 0.3, 0.3, 556.8, 339.1, 887.2, 999.0, 779.0, 11.1, 118.3, 229.2, 669.1, 448.9, 0.5,
];
const NORRIS_Y = [
  0.1, 338.8, 118.1, 888.0, 9.2, 228.1, 668.5, 998.5, 449.1, 778.9, 559.2, 0.3, 0.1, 778.1, 668.8, 339.3, 448.9, 10.8,
  557.7, 228.3, 998.0, 888.8, 119.6, 0.3, 0.6, 557.6, 339.3, 888.0, 998.5, 778.9, 10.2, 117.6, 228.9, 668.4, 449.2, 0.2,
];

/** Log relative error, the digits-of-agreement measure NIST uses to grade StRD results. */
const lre = (got: number, certified: number) => -Math.log10(Math.abs(got - certified) / Math.abs(certified));

describe("linearFit", () => {
  it("reproduces the NIST StRD Norris certified slope, intercept and R² to at least 9 significant digits", () => {
    const fit = linearFit(NORRIS_X, NORRIS_Y);
    expect(fit.n).toBe(36);
    expect(lre(fit.slope, 1.00211681802045)).toBeGreaterThan(9);
    expect(lre(fit.intercept, -0.262323073774029)).toBeGreaterThan(9);
    expect(lre(fit.r2, 0.999993745883712)).toBeGreaterThan(9);
  });

  it("accepts typed arrays and gives the same fit as plain arrays", () => {
    expect(linearFit(Float64Array.from(NORRIS_X), Float64Array.from(NORRIS_Y))).toEqual(linearFit(NORRIS_X, NORRIS_Y));
  });

  it("returns the line itself, with R² = 1, for points exactly on y = 3x − 7", () => {
    const x = [-2, 0.5, 1, 4, 10];
    const fit = linearFit(x, x.map((v) => 3 * v - 7));
    expect(fit.slope).toBeCloseTo(3, 12);
    expect(fit.intercept).toBeCloseTo(-7, 12);
    expect(fit.r2).toBeCloseTo(1, 12);
    expect(fit.n).toBe(5);
  });

  it("fits two points exactly", () => {
    expect(linearFit([1, 3], [2, 6])).toEqual({ slope: 2, intercept: 0, r2: 1, n: 2 });
  });

  it("skips pairs where x or y is NaN (or infinite) and matches the fit of the remaining pairs", () => {
    const x = [0, 1, NaN, 2, 3, 4, Infinity];
    const y = [1.1, NaN, 5, 4.9, 7.2, 8.8, 3];
    expect(linearFit(x, y)).toEqual(linearFit([0, 2, 3, 4], [1.1, 4.9, 7.2, 8.8]));
  });

  it("satisfies slope(y on x) · slope(x on y) = R² (cross-check identity)", () => {
    const yx = linearFit(NORRIS_X, NORRIS_Y);
    const xy = linearFit(NORRIS_Y, NORRIS_X);
    expect(yx.slope * xy.slope).toBeCloseTo(yx.r2, 12);
    expect(xy.r2).toBeCloseTo(yx.r2, 12);
  });

  it("gives slope 0 and R² NaN when y is constant (SStot = 0)", () => {
    const fit = linearFit([1, 2, 3], [5, 5, 5]);
    expect(fit.slope).toBe(0);
    expect(fit.intercept).toBe(5);
    expect(fit.r2).toBeNaN();
  });

  it("does not mutate its inputs", () => {
    const x = Object.freeze([...NORRIS_X]);
    const y = Object.freeze([...NORRIS_Y]);
    linearFit(x, y);
    expect(x).toEqual(NORRIS_X);
    expect(y).toEqual(NORRIS_Y);
  });

  it("throws on empty input, one sample, or one usable pair", () => {
    expect(() => linearFit([], [])).toThrow(/at least 2 usable/);
    expect(() => linearFit([1], [1])).toThrow(/at least 2 usable/);
    expect(() => linearFit([1, NaN, 3], [1, 2, NaN])).toThrow(/at least 2 usable/);
  });

  it("throws when x is constant", () => {
    expect(() => linearFit([2, 2, 2], [1, 2, 3])).toThrow(/x to vary/);
  });

  it("throws when x and y differ in length", () => {
    expect(() => linearFit([1, 2, 3], [1, 2])).toThrow(/equal length/);
  });

  it("agrees with simple-statistics' linearRegression and rSquared on noisy path-loss-like data", () => {
    // Reference library from the registry, used as an oracle; the data is a log-distance line
    // with pseudo-random scatter (a seeded LCG), large x offsets included.
    let seed = 99;
    const rand = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const x = Array.from({ length: 5000 }, () => 1 + 3 * rand());
    const y = x.map((v) => -40 - 27 * v + 8 * (rand() - 0.5));
    const pairs = x.map((v, i) => [v, y[i]]);
    const ref = linearRegression(pairs);
    const fit = linearFit(x, y);
    expect(fit.slope).toBeCloseTo(ref.m, 9);
    expect(fit.intercept).toBeCloseTo(ref.b, 9);
    expect(fit.r2).toBeCloseTo(rSquared(pairs, linearRegressionLine(ref)), 9);
  });
});
