/**
 * Cuts the flown track into polylines: never across a reception gap (`breaks`), and into runs of
 * one colour bin so the map needs a handful of layers, not one per point.
 */
import type { TrackResponse } from "@/lib/series/types";

/** Points `start…end` (inclusive indices into the track) drawn in one colour; bin null = no link value. */
export interface TrackPiece {
  bin: number | null;
  start: number;
  end: number;
}

export interface TrackPieces {
  pieces: TrackPiece[];
  /** How many track points the pieces draw (points with a valid position). */
  pointCount: number;
}

type TrackLike = Pick<TrackResponse, "lat" | "lon" | "link" | "breaks">;

const validPosition = (lat: number, lon: number) =>
  Number.isFinite(lat) && Number.isFinite(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180;

/**
 * Pieces of the track. A segment between two points takes the worse of their bins (no value
 * counts as worst), so a single weak sample still shows on the map — the track endpoint keeps the
 * worst sample of each bucket for exactly that reason. Consecutive segments of one bin join into a
 * piece, and each piece ends on the point where the next one starts, so the line has no holes.
 * A stretch with a single point (between two gaps) becomes a one-point piece, drawn as a dot.
 * Points without a valid position are skipped and split the line like a break.
 */
export function trackPieces(track: TrackLike, binOf: (value: number | null) => number | null): TrackPieces {
  const n = Math.min(track.lat.length, track.lon.length);
  const breakAt = new Set(track.breaks);
  const pieces: TrackPiece[] = [];
  let pointCount = 0;

  // Ranks: -1 for no value, so min() picks "no value" over any bin.
  const rank = (i: number) => binOf(track.link[i] ?? null) ?? -1;
  const toBin = (r: number) => (r < 0 ? null : r);

  let prev = -1; // previous valid point in the current stretch, -1 at a stretch start
  let current: TrackPiece | null = null;
  let stretchHasSegment = false;

  const closeStretch = () => {
    if (prev >= 0 && !stretchHasSegment) pieces.push({ bin: toBin(rank(prev)), start: prev, end: prev });
    current = null;
    prev = -1;
    stretchHasSegment = false;
  };

  for (let i = 0; i < n; i++) {
    if (!validPosition(track.lat[i], track.lon[i])) {
      closeStretch();
      continue;
    }
    if (breakAt.has(i)) closeStretch();
    pointCount++;
    if (prev >= 0) {
      const bin = toBin(Math.min(rank(prev), rank(i)));
      stretchHasSegment = true;
      if (current && current.bin === bin && current.end === prev) {
        current.end = i;
      } else {
        current = { bin, start: prev, end: i };
        pieces.push(current);
      }
    }
    prev = i;
  }
  closeStretch();
  return { pieces, pointCount };
}

/** Pieces grouped by bin, so each colour is one multi-line layer. Keys: bin, or "none". */
export function groupByBin(pieces: TrackPiece[]): Map<number | "none", TrackPiece[]> {
  const groups = new Map<number | "none", TrackPiece[]>();
  for (const p of pieces) {
    const key = p.bin ?? "none";
    const list = groups.get(key);
    if (list) list.push(p);
    else groups.set(key, [p]);
  }
  return groups;
}
