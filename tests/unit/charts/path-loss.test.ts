import { describe, expect, it } from "vitest";
import { distanceAtRssi, FREE_SPACE_EXPONENT, logDistanceRssi, pathLossLines } from "@/components/charts/path-loss";

/** ITU-R P.525 free-space basic transmission loss, dB (f in MHz, d in km). */
const p525 = (fMHz: number, dKm: number) => 32.45 + 20 * Math.log10(fMHz) + 20 * Math.log10(dKm);

describe("log-distance model", () => {
  it("falls 10·n dB per decade from P0 at 1 m", () => {
    expect(logDistanceRssi(1, -40, 2.5)).toBe(-40);
    expect(logDistanceRssi(10, -40, 2.5)).toBeCloseTo(-65, 12);
    expect(logDistanceRssi(100, -40, 2.5)).toBeCloseTo(-90, 12);
    expect(logDistanceRssi(1000, -40, 3.2)).toBeCloseTo(-136, 12);
    expect(logDistanceRssi(316.2278, -30, 2)).toBeCloseTo(-80, 4);
  });

  it("has no value at or below 0 m", () => {
    expect(logDistanceRssi(0, -40, 2)).toBeNull();
    expect(logDistanceRssi(-5, -40, 2)).toBeNull();
    expect(logDistanceRssi(Number.NaN, -40, 2)).toBeNull();
  });
});

describe("pathLossLines", () => {
  it("gives the fit and the free-space line from the same P0", () => {
    const { fit, freeSpace } = pathLossLines([1, 10, 100, 1000], { p0Dbm: -38, pathLossExponent: 2.8 });
    expect(fit.map((v) => Number(v!.toFixed(6)))).toEqual([-38, -66, -94, -122]);
    expect(freeSpace.map((v) => Number(v!.toFixed(6)))).toEqual([-38, -58, -78, -98]);
  });

  it("matches ITU-R P.525 free-space loss when P0 is the 1 m level", () => {
    // 2.4 GHz, 20 dBm transmitted (isotropic antennas): RSSI(d) = 20 − L(d).
    const f = 2400;
    const p0 = 20 - p525(f, 0.001);
    expect(p525(f, 0.001)).toBeCloseTo(40.05, 2);
    const ds = [10, 250, 3000];
    const { freeSpace } = pathLossLines(ds, { p0Dbm: p0, pathLossExponent: 3 });
    ds.forEach((d, i) => expect(freeSpace[i]).toBeCloseTo(20 - p525(f, d / 1000), 9));
    expect(FREE_SPACE_EXPONENT).toBe(2);
  });
});

describe("distanceAtRssi", () => {
  it("inverts the model", () => {
    expect(distanceAtRssi(-90, -40, 2.5)).toBeCloseTo(100, 9);
    expect(distanceAtRssi(-100, -40, 2)).toBeCloseTo(1000, 9);
    const d = distanceAtRssi(-97, -35.5, 2.73)!;
    expect(logDistanceRssi(d, -35.5, 2.73)).toBeCloseTo(-97, 9);
  });

  it("refuses a non-positive exponent", () => {
    expect(distanceAtRssi(-90, -40, 0)).toBeNull();
    expect(distanceAtRssi(-90, -40, -1)).toBeNull();
  });
});
