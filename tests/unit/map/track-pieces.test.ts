import { describe, expect, it } from "vitest";
import { groupByBin, trackPieces, type TrackPiece } from "@/components/map/track-pieces";
import { linkBin, linkScale } from "@/components/map/link-colour";

// Synthetic tracks written for these tests: points 1e-4° apart along a line.
const track = (link: (number | null)[], breaks: number[] = []) => ({
  lat: link.map((_, i) => 51 + i * 1e-4),
  lon: link.map((_, i) => -1 + i * 1e-4),
  link,
  breaks,
});
const lq = linkScale("lqPct");
const bin = (v: number | null) => linkBin(v, lq);

/** Every consecutive pair of points in one stretch must be drawn by exactly one piece. */
const segmentsCovered = (pieces: TrackPiece[]) => {
  const segs: string[] = [];
  for (const p of pieces) for (let i = p.start; i < p.end; i++) segs.push(`${i}-${i + 1}`);
  return segs;
};

describe("trackPieces", () => {
  it("draws one piece for a track in one bin", () => {
    const { pieces, pointCount } = trackPieces(track([95, 96, 99, 100]), bin);
    expect(pieces).toEqual([{ bin: 7, start: 0, end: 3 }]);
    expect(pointCount).toBe(4);
  });

  it("joins runs of one bin and shares each boundary point with the next piece", () => {
    // bins:          7   7   7   2   2   7   7
    const link = [95, 96, 97, 30, 31, 98, 99];
    const { pieces } = trackPieces(track(link), bin);
    // A segment takes the worse end: 2-3 and 4-5 touch the weak points and are bin 2.
    expect(pieces).toEqual([
      { bin: 7, start: 0, end: 2 },
      { bin: 2, start: 2, end: 5 },
      { bin: 7, start: 5, end: 6 },
    ]);
    for (let k = 1; k < pieces.length; k++) expect(pieces[k].start).toBe(pieces[k - 1].end);
    expect(segmentsCovered(pieces)).toEqual(["0-1", "1-2", "2-3", "3-4", "4-5", "5-6"]);
  });

  it("keeps a single weak sample visible, even as the last point", () => {
    const { pieces } = trackPieces(track([90, 91, 92, 5]), bin);
    expect(pieces).toEqual([
      { bin: 7, start: 0, end: 2 },
      { bin: 0, start: 2, end: 3 },
    ]);
    const first = trackPieces(track([5, 90, 91]), bin).pieces;
    expect(first).toEqual([
      { bin: 0, start: 0, end: 1 },
      { bin: 7, start: 1, end: 2 },
    ]);
  });

  it("never draws across a break", () => {
    const { pieces, pointCount } = trackPieces(track([95, 95, 95, 95, 95, 95], [3]), bin);
    expect(pieces).toEqual([
      { bin: 7, start: 0, end: 2 },
      { bin: 7, start: 3, end: 5 },
    ]);
    expect(segmentsCovered(pieces)).not.toContain("2-3");
    expect(pointCount).toBe(6);
  });

  it("splits at several breaks, and ignores a break at 0", () => {
    const { pieces } = trackPieces(track([50, 50, 50, 50, 50, 50, 50], [0, 2, 5]), bin);
    expect(pieces).toEqual([
      { bin: 4, start: 0, end: 1 },
      { bin: 4, start: 2, end: 4 },
      { bin: 4, start: 5, end: 6 },
    ]);
  });

  it("makes a one-point piece for a point alone between two breaks", () => {
    const { pieces } = trackPieces(track([80, 80, 20, 80, 80], [2, 3]), bin);
    expect(pieces).toEqual([
      { bin: 6, start: 0, end: 1 },
      { bin: 1, start: 2, end: 2 },
      { bin: 6, start: 3, end: 4 },
    ]);
  });

  it("treats a missing link value as its own class, worse than any bin", () => {
    const { pieces } = trackPieces(track([95, 95, null, 95, 95]), bin);
    expect(pieces).toEqual([
      { bin: 7, start: 0, end: 1 },
      { bin: null, start: 1, end: 3 },
      { bin: 7, start: 3, end: 4 },
    ]);
  });

  it("draws a track without a link metric as one neutral piece per stretch", () => {
    const { pieces } = trackPieces(track([null, null, null, null], [2]), () => null);
    expect(pieces).toEqual([
      { bin: null, start: 0, end: 1 },
      { bin: null, start: 2, end: 3 },
    ]);
  });

  it("skips points without a valid position and splits the line there", () => {
    const t = track([60, 60, 60, 60, 60]);
    t.lat[2] = NaN;
    const { pieces, pointCount } = trackPieces(t, bin);
    expect(pieces).toEqual([
      { bin: 4, start: 0, end: 1 },
      { bin: 4, start: 3, end: 4 },
    ]);
    expect(pointCount).toBe(4);
  });

  it("returns nothing for an empty track", () => {
    expect(trackPieces(track([]), bin)).toEqual({ pieces: [], pointCount: 0 });
  });

  it("needs few pieces for a long track: one per change of bin, not one per point", () => {
    const link = Array.from({ length: 4000 }, (_, i) => (i < 2000 ? 95 : i < 2100 ? 20 : 95));
    const { pieces, pointCount } = trackPieces(track(link), bin);
    expect(pieces.length).toBe(3);
    expect(pointCount).toBe(4000);
    expect(pieces.map((p) => p.bin)).toEqual([7, 1, 7]);
  });
});

describe("groupByBin", () => {
  it("collects the pieces of each bin under one key", () => {
    const { pieces } = trackPieces(track([95, 95, 20, 20, 95, 95, null, null]), bin);
    const groups = groupByBin(pieces);
    expect([...groups.keys()].sort()).toEqual([1, 7, "none"].sort());
    expect(groups.get(7)).toHaveLength(2);
    expect(groups.get(1)).toEqual([{ bin: 1, start: 1, end: 4 }]);
    expect(groups.get("none")).toEqual([{ bin: null, start: 5, end: 7 }]);
  });
});
