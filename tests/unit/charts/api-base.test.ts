/** The charts and map ask the run routes by default, and a share link's routes when given its base. */
import { describe, expect, it } from "vitest";
import { pointsUrl, runApiBase, seriesUrl, trackUrl } from "@/components/charts/series-request";

describe("data endpoint base", () => {
  it("defaults to the run routes", () => {
    expect(runApiBase(12)).toBe("/api/runs/12");
    expect(trackUrl(12)).toBe("/api/runs/12/track");
    expect(trackUrl(12, "3.5")).toBe("/api/runs/12/track?v=3.5");
  });

  it("uses the given base for series, points and track", () => {
    const base = "/api/share/abc_DEF-123";
    expect(seriesUrl(12, ["rssiDbm"], { from: 1, to: 2 }, 800, "v1", base)).toBe(`${base}/series?fields=rssiDbm&points=800&from=1&to=2&v=v1`);
    expect(pointsUrl(12, ["distanceFromHomeM", "rssiDbm"], 1500, undefined, base)).toBe(`${base}/points?fields=distanceFromHomeM,rssiDbm&points=1500`);
    expect(trackUrl(12, "v1", base)).toBe(`${base}/track?v=v1`);
  });
});
