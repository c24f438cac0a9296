import { describe, expect, it } from "vitest";
import { indexRange, lowerBound, nearestIndex, upperBound } from "@/components/map/nearest-time";

const t = [0, 0.5, 1, 1, 1, 2.5, 4];

describe("lowerBound / upperBound", () => {
  it("finds the first index at or after, and strictly after, a time", () => {
    expect(lowerBound(t, 1)).toBe(2);
    expect(upperBound(t, 1)).toBe(5);
    expect(lowerBound(t, -1)).toBe(0);
    expect(lowerBound(t, 9)).toBe(7);
    expect(upperBound(t, 4)).toBe(7);
    expect(lowerBound([], 3)).toBe(0);
  });
});

describe("nearestIndex", () => {
  it("picks the nearest point", () => {
    expect(nearestIndex(t, 0.2)).toBe(0);
    expect(nearestIndex(t, 0.3)).toBe(1);
    expect(nearestIndex(t, 1.6)).toBe(4); // 0.6 from t=1 (last of the equal run), 0.9 from 2.5
    expect(nearestIndex(t, 1.9)).toBe(5);
    expect(nearestIndex(t, 3.3)).toBe(6);
  });

  it("takes the earlier point on a tie", () => {
    expect(nearestIndex(t, 0.25)).toBe(0);
    expect(nearestIndex(t, 3.25)).toBe(5);
  });

  it("clamps outside the run and returns −1 with no points or no time", () => {
    expect(nearestIndex(t, -5)).toBe(0);
    expect(nearestIndex(t, 100)).toBe(6);
    expect(nearestIndex([], 1)).toBe(-1);
    expect(nearestIndex(t, NaN)).toBe(-1);
  });

  it("agrees with a linear scan on a long irregular clock", () => {
    const clock: number[] = [];
    let x = 0;
    for (let i = 0; i < 5000; i++) {
      x += i % 97 === 0 ? 3.7 : 0.1 + (i % 7) * 0.013;
      clock.push(Number(x.toFixed(3)));
    }
    for (const q of [-1, 0.05, 12.34, 333.3, 456.789, 700.01, 1e6]) {
      let best = 0;
      for (let i = 1; i < clock.length; i++) if (Math.abs(clock[i] - q) < Math.abs(clock[best] - q)) best = i;
      expect(nearestIndex(clock, q)).toBe(best);
    }
  });
});

describe("indexRange", () => {
  it("returns the inclusive index range inside [from, to]", () => {
    expect(indexRange(t, 0.5, 1)).toEqual([1, 4]);
    expect(indexRange(t, 0.6, 3)).toEqual([2, 5]);
    expect(indexRange(t, -10, 10)).toEqual([0, 6]);
    expect(indexRange(t, 3, 0.6)).toEqual([2, 5]); // order of the ends does not matter
  });

  it("returns null when no point lies inside", () => {
    expect(indexRange(t, 2.6, 3.9)).toBeNull();
    expect(indexRange(t, 5, 6)).toBeNull();
    expect(indexRange([], 0, 1)).toBeNull();
  });
});
