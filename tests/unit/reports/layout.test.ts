/** The PDF debrief's pure layout helpers (lib/reports/layout.ts). */
import { describe, expect, it } from "vitest";
import {
  EARTH_RADIUS_M, boundsOf, cleanText, fitToBox, fontRuns, localProjection, niceStep, niceTicks, pieces, reportFileName, scaleBar, stepDecimals, timeTicks,
  trackRanges, valueRange,
} from "@/lib/reports/layout";

// One degree of arc on the sphere of mean radius R1 (IUGG): π R / 180 = 111,195.08 m.
const DEG_M = (Math.PI * EARTH_RADIUS_M) / 180;

describe("localProjection", () => {
  it("maps a degree of latitude to π R / 180 m north, and a degree of longitude to cos(lat) of that east", () => {
    const p = localProjection({ lat: 60, lon: 10 });
    expect(p({ lat: 60, lon: 10 })).toEqual({ x: 0, y: 0 });
    expect(p({ lat: 61, lon: 10 }).y).toBeCloseTo(DEG_M, 6);
    // cos 60° = 0.5 exactly in real numbers; floating point gives 0.5000000000000001.
    expect(p({ lat: 60, lon: 11 }).x).toBeCloseTo(DEG_M * 0.5, 3);
    expect(p({ lat: 59, lon: 9 })).toEqual({ x: expect.closeTo(-DEG_M * 0.5, 3), y: expect.closeTo(-DEG_M, 6) });
  });

  it("takes longitudes the short way round across the antimeridian", () => {
    const p = localProjection({ lat: 0, lon: 179.9999 });
    expect(p({ lat: 0, lon: -179.9999 }).x).toBeCloseTo(0.0002 * DEG_M, 3);
    const q = localProjection({ lat: 0, lon: -179.9999 });
    expect(q({ lat: 0, lon: 179.9999 }).x).toBeCloseTo(-0.0002 * DEG_M, 3);
  });
});

describe("fitToBox", () => {
  it("uses one scale for both axes, centres the drawing and puts north up", () => {
    const b = boundsOf([{ x: -100, y: -50 }, { x: 100, y: 50 }])!;
    const fit = fitToBox(b, { x: 0, y: 0, w: 400, h: 400 }, 0);
    expect(fit.scale).toBe(2); // limited by the 200 m width
    expect(fit.toPage({ x: 0, y: 0 })).toEqual({ x: 200, y: 200 });
    expect(fit.toPage({ x: 100, y: 50 })).toEqual({ x: 400, y: 100 });
    expect(fit.toPage({ x: -100, y: -50 })).toEqual({ x: 0, y: 300 });
  });

  it("keeps the padding and widens a drawing that never moved", () => {
    const fit = fitToBox({ minX: 5, maxX: 5, minY: 5, maxY: 5 }, { x: 10, y: 10, w: 120, h: 220 }, 10, 20);
    expect(fit.scale).toBe(5); // (120 − 2·10) / 20 m
    expect(fit.toPage({ x: 5, y: 5 })).toEqual({ x: 70, y: 120 });
  });

  it("boundsOf ignores non-finite points and is null without points", () => {
    expect(boundsOf([{ x: NaN, y: 1 }])).toBeNull();
    expect(boundsOf([{ x: 1, y: 2 }, { x: Infinity, y: 0 }, { x: -3, y: 4 }])).toEqual({ minX: -3, maxX: 1, minY: 2, maxY: 4 });
  });
});

describe("axis ticks", () => {
  it("niceStep rounds up to 1, 2 or 5 × 10^k", () => {
    expect([0.07, 0.1, 0.3 / 3, 0.13, 3, 4.9, 7, 12, 2500].map(niceStep)).toEqual([0.1, 0.1, 0.1, 0.2, 5, 5, 10, 20, 5000]);
  });

  it("niceTicks gives round values inside the range", () => {
    expect(niceTicks(0, 100, 4)).toEqual({ step: 50, values: [0, 50, 100] });
    expect(niceTicks(13.4, 15.1, 4)).toEqual({ step: 0.5, values: [13.5, 14, 14.5, 15] });
    expect(niceTicks(-3.2, 2.9, 5).values).toEqual([-2, 0, 2]);
    expect(niceTicks(7, 7)).toEqual({ step: 1, values: [7] });
    expect(niceTicks(NaN, 1).values).toEqual([]);
  });

  it("stepDecimals", () => {
    expect([20, 1, 0.5, 0.25, 0.1, 0.05].map(stepDecimals)).toEqual([0, 0, 1, 2, 1, 2]);
  });

  it("timeTicks steps like a clock: seconds, then minutes", () => {
    expect(timeTicks(0, 235.6, 8)).toEqual([0, 30, 60, 90, 120, 150, 180, 210]);
    expect(timeTicks(0, 9, 6)).toEqual([0, 2, 4, 6, 8]);
    expect(timeTicks(0, 3600, 6)).toEqual([0, 600, 1200, 1800, 2400, 3000, 3600]);
    expect(timeTicks(5, 5)).toEqual([]);
  });

  it("valueRange pads the data, takes in a threshold line and never collapses", () => {
    expect(valueRange([0, null, 100])).toEqual({ min: -5, max: 105 });
    expect(valueRange([80, 100], [70])).toEqual({ min: 68.5, max: 101.5 });
    expect(valueRange([4, 4])).toEqual({ min: 3, max: 5 });
    expect(valueRange([null, NaN])).toBeNull();
  });
});

describe("pieces and track ranges", () => {
  it("a null ends a piece, so a gap is drawn as a gap", () => {
    expect(pieces([0, 1, 2, 3, 4, 5], [1, 2, null, 4, null, 6])).toEqual([
      [{ t: 0, v: 1 }, { t: 1, v: 2 }],
      [{ t: 3, v: 4 }],
      [{ t: 5, v: 6 }],
    ]);
    expect(pieces([0, 1], [null, null])).toEqual([]);
  });

  it("trackRanges splits at the break indices", () => {
    expect(trackRanges(10, [4, 7])).toEqual([[0, 4], [4, 7], [7, 10]]);
    expect(trackRanges(5, [])).toEqual([[0, 5]]);
    expect(trackRanges(5, [0, 5, 9, 3, 3])).toEqual([[0, 3], [3, 5]]);
    expect(trackRanges(0, [])).toEqual([]);
  });
});

describe("scaleBar", () => {
  it("the longest round length that fits, in the reader's units", () => {
    expect(scaleBar(130, "metric")).toEqual({ metres: 100, label: "100 m" });
    expect(scaleBar(2600, "metric")).toEqual({ metres: 2000, label: "2 km" });
    expect(scaleBar(0.7, "metric")).toEqual({ metres: 0.5, label: "0.5 m" });
    // 1 ft = 0.3048 m, 1 mi = 1609.344 m exactly (NIST SP 811, Appendix B).
    expect(scaleBar(130, "imperial")).toEqual({ metres: 200 * 0.3048, label: "200 ft" }); // 130 m = 426.5 ft
    expect(scaleBar(2000, "imperial")).toEqual({ metres: 1609.344, label: "1 mi" });
    expect(scaleBar(400, "imperial")).toEqual({ metres: 0.2 * 1609.344, label: "0.2 mi" });
    expect(scaleBar(0, "metric")).toBeNull();
  });
});

describe("text", () => {
  it("cleanText drops control and bidi-override characters and keeps line breaks only when asked", () => {
    expect(cleanText("a\u0000b\u0007c\u001bd\u007f\u0085e")).toBe("abcde");
    expect(cleanText("evil\u202Etxt.exe")).toBe("eviltxt.exe");
    expect(cleanText("one\r\ntwo\tthree")).toBe("one two three");
    expect(cleanText("one\r\ntwo\n\n\n\nthree", true)).toBe("one\ntwo\n\nthree");
    expect(cleanText("Zoe\u0308")).toBe("Zoë"); // NFC
    expect(cleanText(null)).toBe("");
  });

  it("fontRuns picks the first font with the glyph, keeps spaces in the first and replaces what none has", () => {
    const latin = (cp: number) => cp < 0x100;
    const ext = (cp: number) => cp === 0x141 || cp === 0x17a;
    const cyr = (cp: number) => cp >= 0x400 && cp < 0x500;
    expect(fontRuns("Łódź Ана ≤ ✈", [latin, ext, cyr])).toEqual([
      { font: 1, text: "Ł" },
      { font: 0, text: "ód" },
      { font: 1, text: "ź" },
      { font: 0, text: " " },
      { font: 2, text: "Ана" },
      { font: 0, text: " <= ?" },
    ]);
    expect(fontRuns("", [latin])).toEqual([]);
  });

  it("reportFileName is ASCII, from the title, safe in a quoted header", () => {
    expect(reportFileName(12, "Mudlark — flats loop")).toBe("sortie-run-12-mudlark-flats-loop.pdf");
    expect(reportFileName(3, 'Zoë\'s "<script>" run\r\n')).toBe("sortie-run-3-zoe-s-script-run.pdf");
    expect(reportFileName(4, "Ана")).toBe("sortie-run-4.pdf");
    expect(reportFileName(5, "x".repeat(200))).toMatch(/^sortie-run-5-x{60}\.pdf$/);
  });
});
