import { describe, expect, it } from "vitest";
import { classifyFixes, FIX_BAD, FIX_GOOD, FIX_MISSING, fixLostSpans } from "@/lib/analysis/gps-fix";
import { makeSeries } from "@/tests/helpers/series";

// Synthetic rows written for these tests (our own data); 1 Hz unless said.

describe("classifyFixes", () => {
  it("tells good fixes from explicit no-fix rows and rows without a position", () => {
    const s = makeSeries(8, {
      lat: [47.4, NaN, NaN, 0, 47.4, 47.4, 95, 47.4],
      lon: [8.5, NaN, NaN, 0, 8.5, 8.5, 8.5, 8.5],
      fixType: [3, NaN, 0, 3, 0, 3, 3, NaN],
      sats: [9, NaN, NaN, 9, 9, 4, 9, NaN],
    });
    expect(Array.from(classifyFixes(s, 5))).toEqual([FIX_GOOD, FIX_MISSING, FIX_BAD, FIX_BAD, FIX_BAD, FIX_BAD, FIX_BAD, FIX_GOOD]);
  });

  it("counts exactly minSats satellites as enough", () => {
    expect(classifyFixes(makeSeries(1, { lat: [1], lon: [1], sats: [5] }), 5)[0]).toBe(FIX_GOOD);
  });

  it("returns an empty mask for an empty log", () => {
    expect(classifyFixes(makeSeries(0), 5)).toHaveLength(0);
  });
});

describe("fixLostSpans", () => {
  const G = FIX_GOOD;
  const B = FIX_BAD;
  const M = FIX_MISSING;
  const run = (classes: number[], segmentStart?: number[]) =>
    fixLostSpans(makeSeries(classes.length, { sats: () => 9, segmentStart }, { hz: 1 }), Uint8Array.from(classes), classes.indexOf(G), 5);

  it("spans a lost fix from its first bad row to the good fix that ends it", () => {
    expect(run([G, G, B, B, G])).toMatchObject([{ startIndex: 2, endIndex: 3, startS: 2, endS: 4, lastGoodIndex: 1 }]);
  });

  it("ignores rows before home and a single missing row between GPS rows of a mixed-rate log", () => {
    expect(run([B, B, G, M, G, M, G, M, G])).toEqual([]);
  });

  it("counts missing rows once the good fixes around them are 1.5 typical intervals apart", () => {
    expect(run([G, G, G, G, M, G, G])).toMatchObject([{ startS: 4, endS: 5 }]); // fixes 2 s apart, typical 1 s
  });

  it("splits a span at a segment start and does not measure a gap across it", () => {
    const spans = run([G, G, B, B, M, G], [1, 0, 0, 0, 1, 0]);
    expect(spans.map((s) => [s.startS, s.endS])).toEqual([[2, 3]]); // the missing row opening segment 2 is not a loss
  });

  it("returns nothing without a home", () => {
    expect(fixLostSpans(makeSeries(3), Uint8Array.of(B, B, B), -1, 5)).toEqual([]);
  });
});
