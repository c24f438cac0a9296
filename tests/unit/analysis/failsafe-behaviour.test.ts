import { describe, expect, it } from "vitest";
import { inferAction } from "@/lib/analysis/failsafe-behaviour";
import { frozenCopy, makeSeries } from "@/tests/helpers/series";

// Synthetic motion written for these tests (our own data), 10 samples at 10 Hz.
const N = 10;

describe("inferAction", () => {
  it("reads return-to-home from a steady fall in distance from home", () => {
    const home = Array.from({ length: N }, (_, i) => 50 - 3 * i);
    expect(inferAction(makeSeries(N, { speedMps: () => 6 }), 0, N - 1, home)).toEqual({ action: "return-to-home", evidence: "distance from home fell 27.0 m" });
  });

  it("does not read return-to-home from a fall below 2 m or 10 % of the start, or a noisy one", () => {
    expect(inferAction(makeSeries(N), 0, N - 1, Array.from({ length: N }, (_, i) => 10 - 0.1 * i)).action).toBe("none");
    expect(inferAction(makeSeries(N), 0, N - 1, Array.from({ length: N }, (_, i) => 100 - 0.5 * i)).action).toBe("none"); // 4.5 m < 10 m
    expect(inferAction(makeSeries(N), 0, N - 1, [50, 40, 45, 35, 40, 30, 35, 25, 30, 20]).action).toBe("none"); // half the steps up
  });

  it("skips return-to-home without distances and reads hold from a stop instead", () => {
    expect(inferAction(makeSeries(N, { speedMps: () => 0.5 }), 0, N - 1)).toEqual({ action: "hold", evidence: "median speed 0.5 m/s" });
    expect(inferAction(makeSeries(N, { speedMps: () => 0.6 }), 0, N - 1).action).toBe("none");
  });

  it("reads land from a descent to within 1 m of the log's first altitude", () => {
    const alt = [10, 10, 12, 12, 12, 9, 6, 3, 10.5, 11]; // window 2–8: 12 m → 10.5 m, 0.5 m above ground
    expect(inferAction(makeSeries(N, { altM: alt, speedMps: () => 0 }), 2, 8)).toEqual({ action: "land", evidence: "altitude fell 1.5 m" });
  });

  it("needs at least three samples of a field in the window", () => {
    expect(inferAction(makeSeries(N, { speedMps: () => 0 }), 0, 1).action).toBe("none");
    expect(inferAction(makeSeries(0), 0, 0).action).toBe("none");
  });

  it("leaves its input untouched", () => {
    const s = makeSeries(N, { speedMps: () => 0 });
    expect(inferAction(frozenCopy(s), 0, N - 1)).toEqual(inferAction(s, 0, N - 1));
  });
});
