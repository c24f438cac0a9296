import { describe, expect, it } from "vitest";
import { formatDegrees, graticuleStep, graticuleValues, MAX_STEP_DEG, niceStep, stepDecimals } from "@/components/map/graticule";

describe("niceStep", () => {
  it("rounds up to the next 1-2-5 step", () => {
    expect(niceStep(1)).toBe(1);
    expect(niceStep(1.01)).toBe(2);
    expect(niceStep(2)).toBe(2);
    expect(niceStep(3)).toBe(5);
    expect(niceStep(6)).toBe(10);
    expect(niceStep(0.15)).toBe(0.2);
    expect(niceStep(0.2)).toBe(0.2);
    expect(niceStep(0.0034)).toBe(0.005);
    expect(niceStep(0.00051)).toBe(0.001);
    expect(niceStep(12)).toBe(20);
  });

  it("has no step for a non-positive span", () => {
    expect(niceStep(0)).toBeNaN();
    expect(niceStep(-1)).toBeNaN();
  });
});

describe("graticuleStep", () => {
  it("keeps lines at least the minimum gap apart", () => {
    // 0.01° over 900 px with a 90 px gap: raw 0.001 → 0.001 (10 lines).
    expect(graticuleStep(0.01, 900, 90)).toBe(0.001);
    // 0.012° → raw 0.0012 → 0.002.
    expect(graticuleStep(0.012, 900, 90)).toBe(0.002);
    // A town: 0.3° over 600 px → raw 0.045 → 0.05.
    expect(graticuleStep(0.3, 600, 90)).toBe(0.05);
    // A rover's yard: 0.0005° (~35 m) over 800 px → raw 5.6e-5 → 1e-4.
    expect(graticuleStep(0.0005, 800, 90)).toBe(0.0001);
  });

  it("halves with each zoom level until a ladder step is crossed", () => {
    const steps = [0.08, 0.04, 0.02, 0.01, 0.005].map((span) => graticuleStep(span, 800, 90));
    expect(steps).toEqual([0.01, 0.005, 0.005, 0.002, 0.001]);
  });

  it("caps the spacing at 10° for a world view", () => {
    expect(graticuleStep(360, 400, 90)).toBe(MAX_STEP_DEG);
    expect(graticuleStep(0, 400)).toBe(MAX_STEP_DEG);
  });
});

describe("graticuleValues", () => {
  it("lists the multiples of the step in the range, without float noise", () => {
    expect(graticuleValues(0.05, 0.95, 0.1)).toEqual([0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9]);
    expect(graticuleValues(-1.0035, -0.9975, 0.002)).toEqual([-1.002, -1, -0.998]);
    expect(graticuleValues(51.2, 51.4, 0.1)).toEqual([51.2, 51.3, 51.4]);
  });

  it("returns nothing for a bad step, an inverted range or too many lines", () => {
    expect(graticuleValues(0, 1, 0)).toEqual([]);
    expect(graticuleValues(1, 0, 0.1)).toEqual([]);
    expect(graticuleValues(0, 1, 0.0001, 500)).toEqual([]);
  });
});

describe("stepDecimals and formatDegrees", () => {
  it("shows as many decimals as the step needs", () => {
    expect(stepDecimals(10)).toBe(0);
    expect(stepDecimals(1)).toBe(0);
    expect(stepDecimals(0.5)).toBe(1);
    expect(stepDecimals(0.02)).toBe(2);
    expect(stepDecimals(0.001)).toBe(3);
    expect(stepDecimals(5e-6)).toBe(6);
  });

  it("writes hemispheres", () => {
    expect(formatDegrees(51.25, 0.05, "lat")).toBe("51.25° N");
    expect(formatDegrees(-33.9, 0.1, "lat")).toBe("33.9° S");
    expect(formatDegrees(-0.002, 0.001, "lon")).toBe("0.002° W");
    expect(formatDegrees(151.2, 0.2, "lon")).toBe("151.2° E");
    expect(formatDegrees(0, 0.01, "lon")).toBe("0.00°");
  });
});
