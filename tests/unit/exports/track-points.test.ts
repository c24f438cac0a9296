/** Which positions start a new track segment: the log's own segment starts, reception gaps, time going back. */
import { describe, expect, it } from "vitest";
import { Segmenter, segmentRules, trackPoints } from "@/lib/exports/track-points";

const run = (t: number[], opts: { lat?: number[]; breaks?: number[]; gapS?: number | null; positionGapS?: number | null } = {}) => {
  const lat = opts.lat ?? t.map((_, i) => 50 + i * 1e-5);
  const seg = new Segmenter({ gapS: opts.gapS ?? 1, positionGapS: opts.positionGapS ?? 2 });
  return [...trackPoints(seg, { t, lat, lon: t.map(() => 7) }, (i) => (opts.breaks ?? []).includes(i))].map((p) => (p.newSegment ? "S" : "."));
};

describe("track segments", () => {
  it("starts one segment at the first position", () => {
    expect(run([0, 0.2, 0.4, 0.6]).join("")).toBe("S...");
  });

  it("starts a new segment after a reception gap, a stored break and time going back", () => {
    expect(run([0, 0.2, 5, 5.2, 5.4, 5.6, 5.1, 5.3], { breaks: [4] }).join("")).toBe("S.S.S.S.");
  });

  it("skips samples without a position, and breaks after positions stop for too long", () => {
    const t = [0, 0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0, 2.2, 2.4, 2.6, 2.8];
    const lat = t.map((_, i) => (i >= 2 && i <= 13 ? NaN : 50));
    // 0.4 s sample steps (no sample gap), but 2.4 s without a fix > positionGapS 2.
    expect(run(t, { lat }).join("")).toBe("S.S");
    // Position 0,0 is "no fix" (as on the map).
    expect([...trackPoints(new Segmenter({ gapS: null, positionGapS: null }), { t: [0, 1], lat: [0, 1], lon: [0, 1] })]).toHaveLength(1);
  });

  it("derives the thresholds as the display levels do (5 × the median step)", () => {
    const t = Array.from({ length: 100 }, (_, i) => i * 0.1);
    const lat = t.map((_, i) => (i % 5 === 0 ? 50 : NaN));
    const r = segmentRules(t, lat, t.map(() => 7), t.map(() => 3));
    expect(r.gapS).toBeCloseTo(0.5, 9);
    expect(r.positionGapS).toBeCloseTo(2.5, 9);
    expect(segmentRules(t, lat, t.map(() => 7), t.map(() => 3), null).gapS).toBeNull();
  });
});
