import { describe, expect, it } from "vitest";
import { bandPixels, markerAtTime } from "@/components/charts/markers";

const markers = [
  { id: 1, startS: 10, endS: 40, tone: "watch" as const },
  { id: 2, startS: 20, endS: 25, tone: "act" as const },
  { id: 3, startS: 100, endS: 100.1, tone: "info" as const },
];

describe("markerAtTime", () => {
  it("finds the narrowest band under the time", () => {
    expect(markerAtTime(markers, 15)?.id).toBe(1);
    expect(markerAtTime(markers, 22)?.id).toBe(2);
    expect(markerAtTime(markers, 50)).toBeNull();
  });

  it("prefers the selected band where bands overlap", () => {
    expect(markerAtTime(markers, 22, 0, 1)?.id).toBe(1);
  });

  it("gives thin bands some slack", () => {
    expect(markerAtTime(markers, 100.5)).toBeNull();
    expect(markerAtTime(markers, 100.5, 0.5)?.id).toBe(3);
  });
});

describe("bandPixels", () => {
  it("clips to the plot", () => {
    expect(bandPixels(-20, 50, 0, 300, 3)).toEqual({ x: 0, w: 50 });
    expect(bandPixels(280, 400, 0, 300, 3)).toEqual({ x: 280, w: 20 });
    expect(bandPixels(400, 500, 0, 300, 3)).toBeNull();
  });

  it("widens a thin band around its centre", () => {
    expect(bandPixels(100, 100.4, 0, 300, 3)).toEqual({ x: 98.7, w: 3 });
  });
});
