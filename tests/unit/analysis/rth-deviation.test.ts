import { describe, expect, it } from "vitest";
import { rthDeviation } from "@/lib/analysis/rth-deviation";
import { makeSeries } from "@/tests/helpers/series";
import { offset, toLatLon } from "./geo-path";

// Synthetic fixes written for these tests (our own data), 1 Hz, metres east/north of an invented origin.
const home = offset(0, 0);
const series = (pts: [number, number][]) => makeSeries(pts.length, toLatLon(pts.map((p) => p[0]), pts.map((p) => p[1])), { hz: 1 });

describe("rthDeviation", () => {
  it("measures each fix's distance from the straight segment from the span's first fix to home", () => {
    const s = series([[90, 0], [100, 0], [60, 3], [30, -2], [0, 0]]);
    const r = rthDeviation(s, [1, 1, 1, 1, 1], home, [{ startS: 1, endS: 4 }]);
    expect(r.spans[0].samples).toBe(4);
    expect(r.spans[0].lineLengthM).toBeCloseTo(100, 2);
    expect(r.spans[0].maxDeviationM).toBeCloseTo(3, 2);
    expect(r.spans[0].rmsDeviationM).toBeCloseTo(Math.sqrt((0 + 9 + 4 + 0) / 4), 2);
    expect(Number.isNaN(r.deviationM[0])).toBe(true);
    expect(r.deviationM[3]).toBeCloseTo(2, 2);
  });

  it("uses the distance to home beyond it and to the start behind it", () => {
    const s = series([[100, 0], [-5, 0], [104, 0]]);
    const r = rthDeviation(s, [1, 1, 1], home, [{ startS: 0, endS: 2 }]);
    expect(r.deviationM[1]).toBeCloseTo(5, 2);
    expect(r.deviationM[2]).toBeCloseTo(4, 2);
  });

  it("gives null statistics for a span without a usable fix or a run without home", () => {
    const s = series([[10, 0], [0, 0]]);
    expect(rthDeviation(s, [0, 0], home, [{ startS: 0, endS: 1 }]).spans[0]).toMatchObject({ from: null, samples: 0, maxDeviationM: null });
    expect(rthDeviation(s, [1, 1], null, [{ startS: 0, endS: 1 }]).spans[0]).toMatchObject({ samples: 0, rmsDeviationM: null });
  });

  it("returns nothing for no spans, and an empty array for an empty log", () => {
    expect(rthDeviation(makeSeries(0), [], home, []).spans).toEqual([]);
    expect(rthDeviation(makeSeries(0), [], home, []).deviationM).toHaveLength(0);
  });
});
