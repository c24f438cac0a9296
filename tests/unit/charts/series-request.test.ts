import { describe, expect, it } from "vitest";
import { niceStep, pointsForWidth, pointsUrl, roundRangeForFetch, seriesUrl } from "@/components/charts/series-request";

describe("pointsForWidth", () => {
  it("asks for about one x position per pixel, bucketed, at most 2000", () => {
    expect(pointsForWidth(328)).toBe(400);
    expect(pointsForWidth(1200)).toBe(1200);
    expect(pointsForWidth(1201)).toBe(1300);
    expect(pointsForWidth(3840)).toBe(2000);
    expect(pointsForWidth(0)).toBe(100);
    expect(pointsForWidth(40)).toBe(100);
  });
});

describe("niceStep", () => {
  it("rounds up to 1, 2 or 5 × 10^k", () => {
    expect(niceStep(0.3)).toBe(0.5);
    expect(niceStep(1)).toBe(1);
    expect(niceStep(1.2)).toBe(2);
    expect(niceStep(3.7)).toBe(5);
    expect(niceStep(7)).toBe(10);
    expect(niceStep(45)).toBe(50);
  });
});

describe("roundRangeForFetch", () => {
  it("rounds a window outward to ~1/20 of its span", () => {
    // span 100 s → step 5 s
    expect(roundRangeForFetch({ from: 101.3, to: 201.3 }, 600)).toEqual({ from: 100, to: 205 });
    // span 12 s → step 0.6 → 1 s
    expect(roundRangeForFetch({ from: 30.2, to: 42.2 }, 600)).toEqual({ from: 30, to: 43 });
  });

  it("gives nearby views the same key", () => {
    const a = roundRangeForFetch({ from: 101.3, to: 201.3 }, 600);
    const b = roundRangeForFetch({ from: 101.9, to: 201.9 }, 600);
    expect(b).toEqual(a);
  });

  it("clamps to the run and keeps null for the whole run", () => {
    expect(roundRangeForFetch({ from: 540.5, to: 599.5 }, 600)).toEqual({ from: 540, to: 600 });
    expect(roundRangeForFetch({ from: 0.4, to: 599.5 }, 600)).toBeNull();
    expect(roundRangeForFetch(null, 600)).toBeNull();
  });

  it("avoids float noise in the key", () => {
    const r = roundRangeForFetch({ from: 0.31, to: 0.93 + 1 }, 600)!;
    expect(String(r.from)).toBe("0.3");
    expect(String(r.to)).toBe("2");
  });
});

describe("urls", () => {
  it("builds the series and points requests", () => {
    expect(seriesUrl(12, ["rssiDbm", "lqPct"], null, 800)).toBe("/api/runs/12/series?fields=rssiDbm,lqPct&points=800");
    expect(seriesUrl(12, ["voltageV"], { from: 30, to: 90 }, 1200)).toBe(
      "/api/runs/12/series?fields=voltageV&points=1200&from=30&to=90",
    );
    expect(seriesUrl(12, ["voltageV"], { from: 30, to: 90 }, 1200, "a1 b")).toBe(
      "/api/runs/12/series?fields=voltageV&points=1200&from=30&to=90&v=a1%20b",
    );
    expect(pointsUrl(3, ["distanceFromHomeM", "rssiDbm"], 1500)).toBe(
      "/api/runs/3/points?fields=distanceFromHomeM,rssiDbm&points=1500",
    );
  });
});
