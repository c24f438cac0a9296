import { describe, expect, it } from "vitest";
import { interpolateCividis } from "d3-scale-chromatic";
import { binCentre, binColour, binRange, LINK_BINS, linkBin, linkColour, linkScale } from "@/components/map/link-colour";

const rgb = (css: string) => {
  const m = /^rgb\((\d+), (\d+), (\d+)\)$/.exec(css);
  if (!m) throw new Error(`not an rgb() colour: ${css}`);
  return [Number(m[1]), Number(m[2]), Number(m[3])];
};
const hex = (h: string) => [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16));
const luminance = ([r, g, b]: number[]) => 0.2126 * r + 0.7152 * g + 0.0722 * b;

describe("linkScale", () => {
  it("uses the common-practice display ranges per metric", () => {
    expect(linkScale("lqPct")).toMatchObject({ min: 0, max: 100, unit: "%", bins: 8 });
    expect(linkScale("rssiPct")).toMatchObject({ min: 0, max: 100, unit: "%" });
    expect(linkScale("rssiDbm")).toMatchObject({ min: -110, max: -50, unit: "dBm" });
    expect(linkScale("snrDb")).toMatchObject({ min: -10, max: 15, unit: "dB" });
    expect(LINK_BINS).toBe(8);
  });
});

describe("linkBin", () => {
  const lq = linkScale("lqPct");
  const dbm = linkScale("rssiDbm");
  const snr = linkScale("snrDb");

  it("cuts 0–100 % into 12.5 % bins with the lower edge inclusive", () => {
    expect(linkBin(0, lq)).toBe(0);
    expect(linkBin(12.49, lq)).toBe(0);
    expect(linkBin(12.5, lq)).toBe(1);
    expect(linkBin(49.9, lq)).toBe(3);
    expect(linkBin(50, lq)).toBe(4);
    expect(linkBin(87.5, lq)).toBe(7);
    expect(linkBin(100, lq)).toBe(7);
  });

  it("cuts −110…−50 dBm into 7.5 dB bins, edges exact", () => {
    expect(linkBin(-110, dbm)).toBe(0);
    expect(linkBin(-102.6, dbm)).toBe(0);
    expect(linkBin(-102.5, dbm)).toBe(1);
    expect(linkBin(-80, dbm)).toBe(4);
    expect(linkBin(-57.5, dbm)).toBe(7);
    expect(linkBin(-57.6, dbm)).toBe(6);
  });

  it("cuts −10…+15 dB SNR into 3.125 dB bins", () => {
    expect(linkBin(-10, snr)).toBe(0);
    expect(linkBin(-6.875, snr)).toBe(1);
    expect(linkBin(2.4, snr)).toBe(3);
    expect(linkBin(2.5, snr)).toBe(4);
  });

  it("clamps values outside the range to the end bins", () => {
    expect(linkBin(-5, lq)).toBe(0);
    expect(linkBin(140, lq)).toBe(7);
    expect(linkBin(-130, dbm)).toBe(0);
    expect(linkBin(-20, dbm)).toBe(7);
  });

  it("has no bin without a value", () => {
    expect(linkBin(null, lq)).toBeNull();
    expect(linkBin(undefined, lq)).toBeNull();
    expect(linkBin(NaN, lq)).toBeNull();
    expect(linkColour(null, lq)).toBeNull();
  });

  it("honours another bin count", () => {
    const five = linkScale("lqPct", 5);
    expect(linkBin(19.9, five)).toBe(0);
    expect(linkBin(20, five)).toBe(1);
    expect(linkBin(100, five)).toBe(4);
  });
});

describe("binColour", () => {
  const lq = linkScale("lqPct");

  it("equals d3's cividis at each bin centre (1/16, 3/16 … 15/16)", () => {
    for (let b = 0; b < 8; b++) {
      expect(binCentre(b, lq)).toBeCloseTo((2 * b + 1) / 16, 12);
      expect(binColour(b, lq)).toBe(interpolateCividis((2 * b + 1) / 16));
    }
    expect(linkColour(55, lq)).toBe(interpolateCividis(9 / 16));
  });

  it("gives eight different colours, dark for weak link and light for strong", () => {
    const colours = Array.from({ length: 8 }, (_, b) => binColour(b, lq));
    expect(new Set(colours).size).toBe(8);
    const lum = colours.map((c) => luminance(rgb(c)));
    for (let b = 1; b < 8; b++) expect(lum[b]).toBeGreaterThan(lum[b - 1]);
    expect(lum[0]).toBeLessThan(60);
    expect(lum[7]).toBeGreaterThan(190);
  });

  it("reports the value range each bin covers", () => {
    expect(binRange(0, lq)).toEqual([0, 12.5]);
    expect(binRange(7, lq)).toEqual([87.5, 100]);
    expect(binRange(2, linkScale("rssiDbm"))).toEqual([-95, -87.5]);
  });
});

describe("cividis endpoints", () => {
  // Published map (Nuñez, Anderton & Renslow 2018, PLOS ONE 13(7)): the authors' 256-entry table
  // (pnnl/cmaputil, colormaps/cividisHexValues.txt) runs from #00204c to #ffe945.
  // d3's interpolateCividis is a polynomial fit to it; at t = 0 and 1 it gives rgb(0, 32, 81) and
  // rgb(253, 234, 69) (values from the d3 implementation, d3-scale-chromatic 3.1.1).
  const published = { low: hex("#00204c"), high: hex("#ffe945") };

  it("d3's endpoints are the values stated above", () => {
    expect(rgb(interpolateCividis(0))).toEqual([0, 32, 81]);
    expect(rgb(interpolateCividis(1))).toEqual([253, 234, 69]);
  });

  it("d3's endpoints lie within 6 levels per channel of the published map", () => {
    const d3Low = rgb(interpolateCividis(0));
    const d3High = rgb(interpolateCividis(1));
    for (let c = 0; c < 3; c++) {
      expect(Math.abs(d3Low[c] - published.low[c])).toBeLessThanOrEqual(6);
      expect(Math.abs(d3High[c] - published.high[c])).toBeLessThanOrEqual(6);
    }
  });

  it("the end bins sit between the published endpoints and mid-grey, on the right sides", () => {
    const lq = linkScale("lqPct");
    const [r0, g0, b0] = rgb(binColour(0, lq));
    const [r7, g7, b7] = rgb(binColour(7, lq));
    // Weak end: blue-dominated navy; strong end: yellow (red and green high, blue low).
    expect(b0).toBeGreaterThan(r0);
    expect(b0).toBeGreaterThan(g0);
    expect(r7).toBeGreaterThan(200);
    expect(g7).toBeGreaterThan(190);
    expect(b7).toBeLessThan(120);
    expect(luminance([r0, g0, b0])).toBeGreaterThan(luminance(published.low));
    expect(luminance([r7, g7, b7])).toBeLessThan(luminance(published.high));
  });
});
