import { describe, expect, it } from "vitest";
import { positionAt, spanEvent } from "@/lib/analysis/span-event";

// Synthetic positions written for these tests (our own data).
const lat = [NaN, 51.5, 0, NaN, 51.6];
const lon = [NaN, -0.1, 0, NaN, -0.2];

describe("positionAt", () => {
  it("gives the fix at the start sample with its distance from home", () => {
    expect(positionAt({ lat, lon }, 4, 4, [0, 1, 2, 3, 40])).toEqual({ lat: 51.6, lon: -0.2, distanceFromHomeM: 40 });
  });

  it("falls back to the last fix before the start, skipping position 0,0", () => {
    expect(positionAt({ lat, lon }, 3, 3, [0, 10, 20, 30, 40])).toEqual({ lat: 51.5, lon: -0.1, distanceFromHomeM: 10 });
  });

  it("uses the first fix inside the span when there is none before it", () => {
    expect(positionAt({ lat, lon }, 0, 2)).toEqual({ lat: 51.5, lon: -0.1, distanceFromHomeM: null });
  });

  it("returns nulls without any fix, keeping a finite distance at the start sample", () => {
    expect(positionAt({ lat: [NaN], lon: [NaN] }, 0)).toEqual({ lat: null, lon: null, distanceFromHomeM: null });
    expect(positionAt({ lat: [NaN], lon: [NaN] }, 0, 0, [12])).toEqual({ lat: null, lon: null, distanceFromHomeM: 12 });
    expect(positionAt({ lat: [], lon: [] }, 0)).toEqual({ lat: null, lon: null, distanceFromHomeM: null });
  });

  it("does not write to its inputs (frozen arrays)", () => {
    const fLat = Object.freeze([...lat]);
    const fLon = Object.freeze([...lon]);
    expect(positionAt({ lat: fLat, lon: fLon }, 3)).toEqual(positionAt({ lat, lon }, 3));
  });
});

describe("spanEvent", () => {
  it("builds an event with the span's times, its position and durationS in detail", () => {
    const e = spanEvent("link-fade", { startIndex: 1, endIndex: 3, startS: 0.1, endS: 0.4 }, { lat, lon }, { peak: 40, threshold: 70, detail: { unit: "%" } });
    expect(e).toEqual({
      kind: "link-fade", startS: 0.1, endS: 0.4, lat: 51.5, lon: -0.1, distanceFromHomeM: null,
      peak: 40, threshold: 70, detail: { durationS: expect.closeTo(0.3, 12), unit: "%" },
    });
  });
});
