import { describe, expect, it } from "vitest";
import { findSpans } from "@/lib/analysis/spans";

// Synthetic series written for these tests (our own data). Clock: 10 Hz, tS = i / 10.
const clock = (n: number) => Array.from({ length: n }, (_, i) => i / 10);
const below = (v: number[], thr: number) => (i: number) => v[i] < thr;

describe("findSpans", () => {
  it("returns the JSDoc example: a 0.5 s run measured to the first sample after it", () => {
    const v = [5, 5, 0, 0, 0, 0, 0, 5];
    expect(findSpans([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7], (i) => v[i] === 0, { minDurationS: 0.5 })).toEqual([
      { startIndex: 2, endIndex: 6, startS: 0.2, endS: 0.7 },
    ]);
  });

  it("keeps a span of exactly the minimum duration and drops one a sample shorter", () => {
    // Decimal clocks do not subtract exactly (0.7 − 0.2 = 0.49999999999999994): the boundary must still hold.
    const exact = [1, 1, 0, 0, 0, 0, 0, 1, 1, 1];
    const short = [1, 1, 0, 0, 0, 0, 1, 1, 1, 1];
    expect(findSpans(clock(10), below(exact, 0.5), { minDurationS: 0.5 })).toEqual([{ startIndex: 2, endIndex: 6, startS: 0.2, endS: 0.7 }]);
    expect(findSpans(clock(10), below(short, 0.5), { minDurationS: 0.5 })).toEqual([]);
  });

  it("ends a span running to the last sample at that sample's time", () => {
    expect(findSpans(clock(6), (i) => i >= 2, { minDurationS: 0 })).toEqual([{ startIndex: 2, endIndex: 5, startS: 0.2, endS: 0.5 }]);
  });

  it("stays in the span until exit is true (hysteresis), not merely until the predicate fails", () => {
    const v = [100, 50, 72, 72, 50, 100, 100];
    const spans = findSpans(clock(7), below(v, 70), { minDurationS: 0, exit: (i) => v[i] >= 75 });
    expect(spans).toEqual([{ startIndex: 1, endIndex: 4, startS: 0.1, endS: 0.5 }]);
    // Without exit, the same series gives two spans.
    expect(findSpans(clock(7), below(v, 70), { minDurationS: 0 })).toHaveLength(2);
  });

  it("finds several spans in order and nothing where the predicate never holds", () => {
    const v = [0, 1, 0, 0, 1, 1, 0];
    expect(findSpans(clock(7), (i) => v[i] === 0, { minDurationS: 0 }).map((s) => [s.startIndex, s.endIndex])).toEqual([[0, 0], [2, 3], [6, 6]]);
    expect(findSpans(clock(7), () => false, { minDurationS: 0 })).toEqual([]);
  });

  it("returns nothing for an empty series and a zero-length span for one sample only at minDurationS 0", () => {
    expect(findSpans([], () => true, { minDurationS: 0 })).toEqual([]);
    expect(findSpans([3], () => true, { minDurationS: 0 })).toEqual([{ startIndex: 0, endIndex: 0, startS: 3, endS: 3 }]);
    expect(findSpans([3], () => true, { minDurationS: 0.1 })).toEqual([]);
  });

  it("skips samples with an unknown time", () => {
    const t = [0, 0.1, NaN, 0.3, 0.4];
    expect(findSpans(t, (i) => i >= 1 && i <= 3, { minDurationS: 0 })).toEqual([{ startIndex: 1, endIndex: 3, startS: 0.1, endS: 0.4 }]);
  });

  it("closes a span at its last sample before a reception gap and never claims the gap's time", () => {
    const t = [0, 0.1, 0.2, 5.0, 5.1, 5.2];
    const seg = [1, 0, 0, 1, 0, 0];
    const spans = findSpans(t, () => true, { minDurationS: 0, breakBefore: (i) => seg[i] === 1 });
    expect(spans).toEqual([
      { startIndex: 0, endIndex: 2, startS: 0, endS: 0.2 },
      { startIndex: 3, endIndex: 5, startS: 5.0, endS: 5.2 },
    ]);
    // The same break from a time step longer than maxGapS, and from time running backwards.
    expect(findSpans(t, () => true, { minDurationS: 0, maxGapS: 1 })).toEqual(spans);
    expect(findSpans([0, 0.1, 0.05, 0.15], () => true, { minDurationS: 0 })).toHaveLength(2);
  });

  it("bridges a long step when no gap rule is given", () => {
    expect(findSpans([0, 0.1, 5, 5.1], (i) => i < 3, { minDurationS: 0 })).toEqual([{ startIndex: 0, endIndex: 2, startS: 0, endS: 5.1 }]);
  });

  it("adds up, at minDurationS 0, to the sample-and-hold time the predicate holds (cross-check)", () => {
    // Deterministic pseudo-random 0/1 pattern (LCG) on an irregular clock.
    let seed = 7;
    const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const t: number[] = [];
    for (let i = 0, acc = 0; i < 500; i++) t.push((acc += 0.05 + rnd() * 0.2));
    const v = t.map(() => (rnd() < 0.4 ? 1 : 0));
    let held = 0;
    for (let i = 0; i + 1 < t.length; i++) if (v[i] === 1) held += t[i + 1] - t[i];
    const spans = findSpans(t, (i) => v[i] === 1, { minDurationS: 0 });
    expect(spans.reduce((s, x) => s + x.endS - x.startS, 0)).toBeCloseTo(held, 9);
  });

  it("does not write to its input (frozen array)", () => {
    const t = Object.freeze(clock(10));
    expect(() => findSpans(t, (i) => i > 3, { minDurationS: 0.2 })).not.toThrow();
    expect(t).toEqual(clock(10));
  });

  it("throws a RangeError for a negative or NaN minimum duration", () => {
    expect(() => findSpans(clock(3), () => true, { minDurationS: -1 })).toThrow(RangeError);
    expect(() => findSpans(clock(3), () => true, { minDurationS: NaN })).toThrow(RangeError);
  });

  describe("confirmS (debounced entry with hysteresis)", () => {
    // Enter above 3, leave only below 2.5; keep a span only with ≥ 1 s continuously above 3.
    const opts = (v: number[]) => ({ minDurationS: 1, confirmS: 1, exit: (i: number) => !(v[i] >= 2.5) });

    it("keeps one span through dips into the dead band, from the first sample above to the first below the exit", () => {
      // 10 Hz: above 3 for 0.3 s, a dip to 2.8, then above for 1.2 s, then 2.4
      const v = [0, 3.2, 3.2, 3.2, 2.8, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 3.2, 2.4, 0];
      const t = clock(v.length);
      expect(findSpans(t, (i) => v[i] > 3, opts(v))).toEqual([{ startIndex: 1, endIndex: 16, startS: 0.1, endS: 1.7 }]);
    });

    it("drops a span whose samples above the threshold never last confirmS in a row", () => {
      // hovering in the dead band with single samples above 3
      const v = Array.from({ length: 60 }, (_, i) => (i % 3 === 0 ? 3.1 : 2.8));
      expect(findSpans(clock(60), (i) => v[i] > 3, opts(v))).toEqual([]);
      // without the debounce, hysteresis alone keeps one long span open
      expect(findSpans(clock(60), (i) => v[i] > 3, { minDurationS: 1, exit: (i) => !(v[i] >= 2.5) })).toHaveLength(1);
    });

    it("throws a RangeError for a negative confirmS", () => {
      expect(() => findSpans(clock(3), () => true, { minDurationS: 0, confirmS: -1 })).toThrow(RangeError);
    });
  });
});
