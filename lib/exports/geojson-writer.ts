/**
 * The flown track as GeoJSON (RFC 7946): a FeatureCollection with one Feature per piece of track
 * (a new piece at every segment start or reception gap). A piece of two or more positions is a
 * LineString (§3.1.4 asks for at least two); a piece of one lone fix is a Point, so no position is
 * dropped. Positions are [longitude, latitude] (§3.1.1) in WGS 84, 7 decimals; no altitude, because
 * the logged altitude is not the height above the ellipsoid that §4 means.
 *
 * Streaming: head(), then points() per chunk, then tail(). A piece's first position is held back
 * until the second arrives (or the piece ends), since only then is its geometry type known.
 */
import { decimal, roundPosition, type TrackPoint } from "./track-points";

export interface GeoJsonMeta {
  name: string;
  startedAt: Date | null;
}

interface Piece {
  index: number;
  count: number;
  first: string;
  startS: number;
  endS: number;
}

const iso = (t0: number | null, s: number) => (t0 !== null && s - s === 0 ? new Date(t0 + Math.round(s * 1000)).toISOString() : null);

export class GeoJsonWriter {
  private piece: Piece | null = null;
  private pieces = 0;
  constructor(private readonly meta: GeoJsonMeta) {}

  head(): string {
    return '{"type":"FeatureCollection","features":[\n';
  }

  private properties(p: Piece): string {
    const t0 = this.meta.startedAt?.getTime() ?? null;
    const props = {
      name: this.meta.name,
      segment: p.index + 1,
      points: p.count,
      startS: Number(decimal(p.startS, 3)),
      endS: Number(decimal(p.endS, 3)),
      startTime: iso(t0, p.startS),
      endTime: iso(t0, p.endS),
    };
    // JSON.stringify escapes the title; members may come in any order (RFC 8259 §4).
    return JSON.stringify(props);
  }

  private close(out: string[]) {
    const p = this.piece;
    if (!p) return;
    const lead = p.index > 0 ? ",\n" : "";
    if (p.count === 1) out.push(`${lead}{"type":"Feature","geometry":{"type":"Point","coordinates":${p.first}},"properties":${this.properties(p)}}`);
    else out.push(`]},"properties":${this.properties(p)}}`);
    this.piece = null;
  }

  points(points: Iterable<TrackPoint>): string {
    const out: string[] = [];
    for (const pt of points) {
      const { lat, lon } = roundPosition(pt.lat, pt.lon);
      const pos = `[${lon},${lat}]`;
      if (pt.newSegment || !this.piece) {
        this.close(out);
        this.piece = { index: this.pieces++, count: 1, first: pos, startS: pt.tS, endS: pt.tS };
        continue;
      }
      const p = this.piece;
      if (p.count === 1) out.push(`${p.index > 0 ? ",\n" : ""}{"type":"Feature","geometry":{"type":"LineString","coordinates":[${p.first}`);
      out.push(`,${pos}`);
      p.count++;
      if (pt.tS > p.endS) p.endS = pt.tS;
    }
    return out.join("");
  }

  tail(): string {
    const out: string[] = [];
    this.close(out);
    return out.join("") + "\n]}\n";
  }
}

export function writeGeoJson(meta: GeoJsonMeta, points: Iterable<TrackPoint>): string {
  const w = new GeoJsonWriter(meta);
  return w.head() + w.points(points) + w.tail();
}
