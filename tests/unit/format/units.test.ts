import { describe, expect, it } from "vitest";
import { formatClock, formatDistance, formatLength, formatSpan, formatSpeed, lengthConversion, speedConversion } from "@/lib/format/units";

// Exact factors: NIST SP 811 (2008), Appendix B.8: 1 ft = 0.3048 m, 1 mi (international) = 1609.344 m,
// 1 mi/h = 0.44704 m/s.
describe("units", () => {
  it("writes distances in m/km or ft/mi", () => {
    expect(formatDistance(812, "metric")).toBe("812 m");
    expect(formatDistance(4.25, "metric")).toBe("4.3 m");
    expect(formatDistance(1609.344, "metric")).toBe("1.61 km");
    expect(formatDistance(1609.344, "imperial")).toBe("1.00 mi");
    expect(formatDistance(30.48, "imperial")).toBe("100 ft");
    expect(formatDistance(null, "metric")).toBe("—");
  });

  it("writes lengths and speeds", () => {
    expect(formatLength(3.048, "imperial")).toBe("10.0 ft");
    expect(formatLength(2.5, "metric")).toBe("2.5 m");
    expect(formatSpeed(0.44704 * 30, "imperial")).toBe("30.0 mph");
    expect(formatSpeed(12.34, "metric")).toBe("12.3 m/s");
    expect(lengthConversion("imperial").convert!(0.3048)).toBeCloseTo(1, 12);
    expect(speedConversion("imperial").convert!(0.44704)).toBeCloseTo(1, 12);
    expect(lengthConversion("metric").convert).toBeUndefined();
  });

  it("writes clock offsets and span lengths", () => {
    expect(formatClock(65)).toBe("1:05");
    expect(formatClock(3725)).toBe("1:02:05");
    expect(formatSpan(4.23)).toBe("4.2 s");
    expect(formatSpan(185)).toBe("3 min 05 s");
    expect(formatSpan(3720)).toBe("1 h 02 min");
  });
});

describe("runs list query", () => {
  it("drops impossible dates and unknown values instead of failing the page", async () => {
    const { readRunListQuery, runListSearch } = await import("@/lib/validations/run-list");
    const q = readRunListQuery({ from: "2024-13-01", to: "2024-02-30", sort: "nonsense", verdict: "act", page: "0", build: "7" });
    expect(q).toMatchObject({ from: undefined, to: undefined, sort: "date", verdict: "act", page: 1, build: 7 });
    expect(readRunListQuery({ from: "2024-02-29" }).from).toBe("2024-02-29"); // a leap day
    expect(runListSearch(q, { page: 2 })).toBe("?build=7&verdict=act&page=2");
  });
});
