import { describe, expect, it } from "vitest";
import { clampRange, minSpanFor, panRange, rangeForKey, rangesEqual, zoomRange } from "@/components/charts/pan-zoom";

const D = 600;

describe("clampRange", () => {
  it("keeps a range inside the run and orders it", () => {
    expect(clampRange({ from: 100, to: 200 }, D)).toEqual({ from: 100, to: 200 });
    expect(clampRange({ from: 200, to: 100 }, D)).toEqual({ from: 100, to: 200 });
  });

  it("shifts a range that sticks out, keeping its span", () => {
    expect(clampRange({ from: -50, to: 50 }, D)).toEqual({ from: 0, to: 100 });
    expect(clampRange({ from: 550, to: 650 }, D)).toEqual({ from: 500, to: 600 });
  });

  it("widens to the minimum span around the middle", () => {
    expect(clampRange({ from: 100, to: 100.2 }, D)).toEqual({ from: 99.6, to: 100.6 });
    expect(minSpanFor(0.4)).toBe(0.4);
  });

  it("spells the whole run as null", () => {
    expect(clampRange({ from: 0, to: 600 }, D)).toBeNull();
    expect(clampRange({ from: -10, to: 700 }, D)).toBeNull();
    expect(clampRange(null, D)).toBeNull();
    expect(clampRange({ from: Number.NaN, to: 5 }, D)).toBeNull();
  });
});

describe("panRange", () => {
  it("moves by a quarter of the span", () => {
    expect(panRange({ from: 100, to: 200 }, 1, D)).toEqual({ from: 125, to: 225 });
    expect(panRange({ from: 100, to: 200 }, -1, D)).toEqual({ from: 75, to: 175 });
  });

  it("stops at the run's ends without shrinking", () => {
    expect(panRange({ from: 10, to: 110 }, -1, D)).toEqual({ from: 0, to: 100 });
    expect(panRange({ from: 480, to: 580 }, 1, D)).toEqual({ from: 500, to: 600 });
  });

  it("does nothing to the whole run", () => {
    expect(panRange(null, 1, D)).toBeNull();
  });
});

describe("zoomRange", () => {
  it("halves the span around the centre", () => {
    expect(zoomRange({ from: 100, to: 300 }, 0.5, D)).toEqual({ from: 150, to: 250 });
    expect(zoomRange(null, 0.5, D)).toEqual({ from: 150, to: 450 });
  });

  it("doubles the span and clamps, back to the whole run when it covers it", () => {
    expect(zoomRange({ from: 100, to: 200 }, 2, D)).toEqual({ from: 50, to: 250 });
    expect(zoomRange({ from: 0, to: 100 }, 2, D)).toEqual({ from: 0, to: 200 });
    expect(zoomRange({ from: 100, to: 400 }, 2, D)).toBeNull();
  });

  it("keeps a given centre at the same place in the view", () => {
    // Centre 125 sits at a quarter of [100, 200]; after halving it still sits at a quarter.
    expect(zoomRange({ from: 100, to: 200 }, 0.5, D, 125)).toEqual({ from: 112.5, to: 162.5 });
  });

  it("never zooms narrower than the minimum span", () => {
    expect(zoomRange({ from: 100, to: 101 }, 0.5, D)).toEqual({ from: 100, to: 101 });
  });
});

describe("rangeForKey", () => {
  const r = { from: 100, to: 200 };
  it("maps the keys", () => {
    expect(rangeForKey("ArrowRight", r, D)).toEqual({ handled: true, range: { from: 125, to: 225 } });
    expect(rangeForKey("ArrowLeft", r, D)).toEqual({ handled: true, range: { from: 75, to: 175 } });
    expect(rangeForKey("+", r, D)).toEqual({ handled: true, range: { from: 125, to: 175 } });
    expect(rangeForKey("=", r, D)).toEqual({ handled: true, range: { from: 125, to: 175 } });
    expect(rangeForKey("-", r, D)).toEqual({ handled: true, range: { from: 50, to: 250 } });
    expect(rangeForKey("0", r, D)).toEqual({ handled: true, range: null });
    expect(rangeForKey("Escape", r, D)).toEqual({ handled: true, range: null });
    expect(rangeForKey("a", r, D)).toEqual({ handled: false });
    expect(rangeForKey("ArrowUp", r, D)).toEqual({ handled: false });
  });
});

describe("rangesEqual", () => {
  it("compares with a tolerance and treats null as the whole run", () => {
    expect(rangesEqual({ from: 1, to: 2 }, { from: 1 + 1e-9, to: 2 })).toBe(true);
    expect(rangesEqual({ from: 1, to: 2 }, { from: 1.1, to: 2 })).toBe(false);
    expect(rangesEqual(null, null)).toBe(true);
    expect(rangesEqual(null, { from: 0, to: 1 })).toBe(false);
  });
});
