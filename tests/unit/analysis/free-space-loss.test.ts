import { describe, expect, it } from "vitest";
import { freeSpaceLossDb } from "@/lib/analysis/free-space-loss";

/*
 * ITU-R P.525-4 §2.2 (point-to-point link): L = 32.45 + 20 log10 f[MHz] + 20 log10 d[km] as
 * DESIGN.md §5 writes it (the Recommendation prints the constant rounded to 32.4). By hand:
 *   2400 MHz, 1 km: log10 2400 = 3.380211 → 20·3.380211 = 67.604; 32.45 + 67.604 + 0 = 100.054 dB
 *    868 MHz, 1 km: log10 868  = 2.938520 → 20·2.938520 = 58.770; 32.45 + 58.770 + 0 =  91.220 dB
 *    915 MHz, 2 km: log10 915  = 2.961421 → 59.228; log10 2 = 0.301030 → 6.021;  = 97.699 dB
 */
describe("freeSpaceLossDb", () => {
  it("gives 100.05 dB at 2400 MHz over 1 km (ITU-R P.525 formula, computed by hand above)", () => {
    expect(freeSpaceLossDb(2400, 1000)).toBeCloseTo(100.05, 2);
  });

  it("gives 91.22 dB at 868 MHz over 1 km (by hand above)", () => {
    expect(freeSpaceLossDb(868, 1000)).toBeCloseTo(91.22, 2);
  });

  it("gives 97.70 dB at 915 MHz over 2 km (by hand above)", () => {
    expect(freeSpaceLossDb(915, 2000)).toBeCloseTo(97.7, 2);
  });

  it("adds 20·log10 2 = 6.02 dB when the distance doubles, and when the frequency doubles", () => {
    expect(freeSpaceLossDb(868, 2400) - freeSpaceLossDb(868, 1200)).toBeCloseTo(6.0206, 4);
    expect(freeSpaceLossDb(1800, 500) - freeSpaceLossDb(900, 500)).toBeCloseTo(6.0206, 4);
  });

  it("adds 20 dB per decade of distance", () => {
    expect(freeSpaceLossDb(2400, 10_000) - freeSpaceLossDb(2400, 1000)).toBeCloseTo(20, 10);
  });

  it("agrees with the ratio form 20·log10(4πd/λ) to within the constant's rounding (32.45 vs 32.4478)", () => {
    const c = 299_792_458;
    for (const [f, d] of [[433, 50], [868, 1000], [2400, 3000], [5800, 12]]) {
      const lambda = c / (f * 1e6);
      expect(Math.abs(freeSpaceLossDb(f, d) - 20 * Math.log10((4 * Math.PI * d) / lambda))).toBeLessThan(0.003);
    }
  });

  it("returns NaN for a missing (NaN) frequency or distance", () => {
    expect(freeSpaceLossDb(NaN, 100)).toBeNaN();
    expect(freeSpaceLossDb(868, NaN)).toBeNaN();
  });

  it("throws for zero, negative or infinite arguments", () => {
    expect(() => freeSpaceLossDb(868, 0)).toThrow(RangeError);
    expect(() => freeSpaceLossDb(868, -5)).toThrow(/distance/);
    expect(() => freeSpaceLossDb(0, 100)).toThrow(/frequency/);
    expect(() => freeSpaceLossDb(Infinity, 100)).toThrow(/frequency/);
  });
});
