/**
 * Cross-check of parseGpx against a general-purpose reference library: @tmcw/togeojson (on
 * @xmldom/xmldom) converting the same real recordings from ../shared/reference/gpx (open-source GPX
 * libraries' test suites; see SOURCES.md there). togeojson drops untimed points from its time list
 * and segments shorter than two points, so the comparison uses files where every point is timed.
 */
import fs from "node:fs";
import path from "node:path";
import { gpx as toGeoJson } from "@tmcw/togeojson";
import { DOMParser } from "@xmldom/xmldom";
import { describe, expect, it } from "vitest";
import { GPX_REFERENCE_DIR } from "@/tests/helpers/parse-errors";
import { parseGpx } from "@/lib/parsers/gpx";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";

const GPX_DIR = GPX_REFERENCE_DIR;

const files = ["gpxpy_cerknicko-jezero.gpx", "georust-gpx_with_accuracy.gpx", "georust-gpx_garmin_with_extensions.gpx", "gpxpy_track-with-less-sec-time.gpx", "georust-gpx_garmin-activity.gpx", "gpxpy_around-visnjan-with-car.gpx"];

interface Line {
  coordinates: number[][];
  times: string[];
}

function referenceLines(xml: string): Line[] {
  const doc = new DOMParser({ onError: () => {} }).parseFromString(xml, "text/xml");
  const out: Line[] = [];
  for (const f of toGeoJson(doc as unknown as Document).features) {
    const g = f.geometry;
    const times = (f.properties?.coordinateProperties as { times?: string[] | string[][] } | undefined)?.times;
    if (g?.type === "LineString") out.push({ coordinates: g.coordinates, times: (times as string[]) ?? [] });
    if (g?.type === "MultiLineString") g.coordinates.forEach((c: number[][], i: number) => out.push({ coordinates: c, times: ((times as string[][]) ?? [])[i] ?? [] }));
  }
  return out;
}

describe("parseGpx against togeojson", () => {
  it.each(files)("reads the same points, times and segments as togeojson in %s", async (file) => {
    const xml = fs.readFileSync(path.join(GPX_DIR, file), "utf8");
    const ref = referenceLines(xml).filter((l) => l.coordinates.length > 0);
    const everyPointTimed = ref.every((l) => l.times.length === l.coordinates.length);
    expect(everyPointTimed).toBe(true);

    const { onBatch, samples } = collectSamples();
    const summary = await parseGpx(byteChunks(xml, 4096), { onBatch });
    const refPoints = ref.flatMap((l) => l.coordinates.map((c, i) => ({ lon: c[0], lat: c[1], time: Date.parse(l.times[i]) })));
    expect(summary.sampleCount).toBe(refPoints.length);
    expect(samples.segmentStart.reduce((a, b) => a + b, 0)).toBe(ref.length - 1);
    const t0 = refPoints[0].time;
    refPoints.forEach((p, i) => {
      expect(samples.columns.lat[i]).toBeCloseTo(p.lat, 9);
      expect(samples.columns.lon[i]).toBeCloseTo(p.lon, 9);
      expect(samples.columns.tS[i]).toBeCloseTo((p.time - t0) / 1000, 3);
    });
    expect(summary.startedAt?.getTime()).toBe(t0);
  });
});
