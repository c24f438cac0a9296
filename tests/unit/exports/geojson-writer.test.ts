/**
 * GeoJSON export against RFC 7946: a FeatureCollection (§3.3) of Features (§3.2); positions are
 * [longitude, latitude] (§3.1.1) within the WGS 84 ranges; a LineString has two or more positions
 * (§3.1.4); a lone fix is a Point (§3.1.2).
 */
import { describe, expect, it } from "vitest";
import { GeoJsonWriter, writeGeoJson } from "@/lib/exports/geojson-writer";
import type { TrackPoint } from "@/lib/exports/track-points";

const pt = (lat: number, lon: number, tS: number, newSegment = false): TrackPoint => ({ lat, lon, tS, altM: 4, sats: 9, hdop: 0.8, newSegment });

type Position = number[];
interface Feature {
  type: string;
  geometry: { type: "LineString"; coordinates: Position[] } | { type: "Point"; coordinates: Position };
  properties: Record<string, unknown>;
}

/** The RFC 7946 rules these documents must keep. */
function checkRfc7946(doc: { type: string; features: Feature[] }) {
  expect(doc.type).toBe("FeatureCollection");
  const position = (p: Position) => {
    expect(p).toHaveLength(2);
    const [lon, lat] = p;
    expect(lon).toBeGreaterThanOrEqual(-180);
    expect(lon).toBeLessThanOrEqual(180);
    expect(lat).toBeGreaterThanOrEqual(-90);
    expect(lat).toBeLessThanOrEqual(90);
  };
  for (const f of doc.features) {
    expect(f.type).toBe("Feature");
    expect(f.properties).toBeTypeOf("object");
    if (f.geometry.type === "LineString") {
      expect(f.geometry.coordinates.length).toBeGreaterThanOrEqual(2);
      f.geometry.coordinates.forEach(position);
    } else {
      expect(f.geometry.type).toBe("Point");
      position(f.geometry.coordinates);
    }
  }
}

describe("GeoJSON writer", () => {
  it("puts longitude first (RFC 7946 §3.1.1) and one LineString per segment", () => {
    const json = writeGeoJson({ name: "loop", startedAt: new Date("2025-05-17T09:30:00Z") }, [
      pt(53.47, -3.05, 0),
      pt(53.4701, -3.0502, 1),
      pt(53.4702, -3.0504, 2),
      pt(53.48, -3.06, 40, true),
      pt(53.4801, -3.0601, 41),
    ]);
    const doc = JSON.parse(json);
    checkRfc7946(doc);
    expect(doc.features).toHaveLength(2);
    expect(doc.features[0].geometry).toEqual({ type: "LineString", coordinates: [[-3.05, 53.47], [-3.0502, 53.4701], [-3.0504, 53.4702]] });
    expect(doc.features[1].geometry.coordinates[0]).toEqual([-3.06, 53.48]);
    expect(doc.features[0].properties).toMatchObject({ name: "loop", segment: 1, points: 3, startS: 0, endS: 2, startTime: "2025-05-17T09:30:00.000Z", endTime: "2025-05-17T09:30:02.000Z" });
  });

  it("a segment of one fix becomes a Point, never a one-position LineString (RFC 7946 §3.1.4)", () => {
    const doc = JSON.parse(writeGeoJson({ name: "x", startedAt: null }, [pt(1, 2, 0), pt(1.1, 2.1, 9, true), pt(1.2, 2.2, 20, true), pt(1.21, 2.21, 21)]));
    checkRfc7946(doc);
    expect(doc.features.map((f: Feature) => f.geometry.type)).toEqual(["Point", "Point", "LineString"]);
    expect(doc.features[1].geometry.coordinates).toEqual([2.1, 1.1]);
    expect(doc.features[0].properties.startTime).toBeNull();
  });

  it("an empty track is an empty FeatureCollection; the title is JSON-escaped", () => {
    const doc = JSON.parse(writeGeoJson({ name: 'say "hi"\n</script>', startedAt: null }, []));
    expect(doc).toEqual({ type: "FeatureCollection", features: [] });
    const one = JSON.parse(writeGeoJson({ name: 'say "hi"\n</script>', startedAt: null }, [pt(0, 0.5, 0), pt(0, 0.6, 1)]));
    expect(one.features[0].properties.name).toBe('say "hi"\n</script>');
  });

  it("chunked writing (a segment split across chunks) equals writing at once, and lon 180 wraps to -180", () => {
    const points = Array.from({ length: 50 }, (_, i) => pt(10 + i * 1e-4, (i % 2 ? 179.99999996 : 179.9999999), i, i === 17 || i === 18));
    const w = new GeoJsonWriter({ name: "c", startedAt: null });
    let chunked = w.head();
    for (let i = 0; i < points.length; i += 7) chunked += w.points(points.slice(i, i + 7));
    chunked += w.tail();
    expect(chunked).toBe(writeGeoJson({ name: "c", startedAt: null }, points));
    const doc = JSON.parse(chunked);
    checkRfc7946(doc);
    expect(doc.features.map((f: Feature) => f.properties.points)).toEqual([17, 1, 32]);
    expect(doc.features[2].geometry.coordinates[1][0]).toBe(-180);
  });
});
