import { describe, expect, it } from "vitest";
import { distanceConverter, formatDistance, formatLogTick, isLogLabelValue, logAxisLabels } from "@/components/charts/log-axis";

describe("log axis labels", () => {
  it("labels 1, 2 and 5 × 10^k only", () => {
    expect([0.5, 1, 2, 3, 5, 7, 10, 20, 40, 50, 200, 300, 1000].map(isLogLabelValue)).toEqual([
      true, true, true, false, true, false, true, true, false, true, true, false, true,
    ]);
    expect(isLogLabelValue(0.30000000000000004)).toBe(false);
    expect(isLogLabelValue(0.2 + 0.1 - 0.1)).toBe(true);
  });

  it("writes compact figures", () => {
    expect(formatLogTick(5)).toBe("5");
    expect(formatLogTick(0.5)).toBe("0.5");
    expect(formatLogTick(500)).toBe("500");
    expect(formatLogTick(2000)).toBe("2k");
    expect(formatLogTick(50000)).toBe("50k");
    expect(formatLogTick(2e6)).toBe("2M");
  });

  it("blanks the in-between splits, and all but decades when narrow", () => {
    const splits = [1, 2, 3, 4, 5, 10, 20, 30];
    expect(logAxisLabels(splits)).toEqual(["1", "2", "", "", "5", "10", "20", ""]);
    expect(logAxisLabels(splits, true)).toEqual(["1", "", "", "", "", "10", "", ""]);
  });
});

describe("distance units", () => {
  it("prefers the caller's converter, else picks by unit name", () => {
    expect(distanceConverter("ft")(304.8)).toBeCloseTo(1000, 9);
    expect(distanceConverter("mi")(1609.344)).toBeCloseTo(1, 12);
    expect(distanceConverter("km")(2500)).toBe(2.5);
    expect(distanceConverter(undefined)(12)).toBe(12);
    expect(distanceConverter("furlong")(12)).toBe(12);
    expect(distanceConverter("ft", (m) => m * 2)(3)).toBe(6);
  });

  it("formats a distance", () => {
    expect(formatDistance(1234, "m")).toBe("1.23k m");
    expect(formatDistance(348.6, "m")).toBe("349 m");
    expect(formatDistance(42.37, "ft")).toBe("42 ft");
    expect(formatDistance(3.456, "m")).toBe("3.5 m");
  });
});
