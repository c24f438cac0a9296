/**
 * GPX export checked against the GPX 1.1 schema itself (Topografix, http://www.topografix.com/GPX/1/1/gpx.xsd,
 * kept in ../shared/reference/gpx-1.1.xsd), validated with libxml2's xmllint compiled to WebAssembly.
 * The track is our own simulator's invented demo run.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { validateXML } from "xmllint-wasm";
import { demoCrew } from "@/db/demo-crew";
import { GpxWriter, writeGpx, xmlText } from "@/lib/exports/gpx-writer";
import { Segmenter, trackPoints, type TrackPoint } from "@/lib/exports/track-points";
import { parseLog } from "@/lib/parsers/parse-log";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { chunksOf } from "../../helpers/byte-source";

const XSD = path.resolve(__dirname, "../../../../shared/reference/gpx-1.1.xsd");
const schema = { fileName: "gpx-1.1.xsd", contents: fs.readFileSync(XSD, "utf8") };

async function validate(xml: string) {
  const res = await validateXML({ xml: { fileName: "track.gpx", contents: xml }, schema, maxMemoryPages: 4096 });
  return { valid: res.valid, errors: res.errors.map((e) => e.rawMessage) };
}

const pt = (lat: number, lon: number, tS: number, extra: Partial<TrackPoint> = {}): TrackPoint => ({ lat, lon, tS, altM: NaN, sats: NaN, hdop: NaN, newSegment: false, ...extra });

const sim = simulateRun({ seed: 4, waypoints: demoCrew.routePlans[0].waypoints, hz: 5 });
const simPoints = () => {
  const seg = new Segmenter({ gapS: 1, positionGapS: 1 });
  return [...trackPoints(seg, { t: sim.map((s) => s.t), lat: sim.map((s) => s.lat), lon: sim.map((s) => s.lon), fixType: sim.map((s) => s.fix), altM: sim.map((s) => s.alt), sats: sim.map((s) => s.sats), hdop: sim.map((s) => s.hdop) })];
};

describe("GPX writer", () => {
  it("the schema check is real: it refuses lon 180, and time before ele", async () => {
    const good = writeGpx({ name: "x", startedAt: null }, [pt(1, 2, 0)]);
    expect((await validate(good.replace('lon="2"', 'lon="180"'))).valid).toBe(false);
    expect((await validate(good.replace("<trkpt lat=\"1\" lon=\"2\">", '<trkpt lat="1" lon="2"><time>2025-01-01T00:00:00Z</time><ele>1</ele>'))).valid).toBe(false);
  });

  it("writes a simulated run that the GPX 1.1 schema accepts, with time, ele, sat and hdop", async () => {
    const points = simPoints();
    const xml = writeGpx({ name: "mudlark-flats-loop", startedAt: new Date("2025-05-17T09:30:00Z") }, points);
    expect(await validate(xml)).toEqual({ valid: true, errors: [] });
    const trkpts = xml.match(/<trkpt /g) ?? [];
    expect(trkpts.length).toBe(points.length);
    // wptType's sequence order (GPX 1.1 schema): ele, time, …, sat, hdop.
    expect(xml).toMatch(/<trkpt lat="-?\d+\.\d+" lon="-?\d+\.\d+"><ele>[\d.-]+<\/ele><time>2025-05-17T09:30:00\.000Z<\/time><sat>\d+<\/sat><hdop>[\d.]+<\/hdop><\/trkpt>/);
    expect(xml).toContain("<metadata><name>mudlark-flats-loop</name><time>2025-05-17T09:30:00.000Z</time></metadata>");
  });

  it("starts a new trkseg at every segment start, and the schema still accepts it", async () => {
    const xml = writeGpx({ name: "gaps", startedAt: null }, [pt(53.47, -3.05, 0), pt(53.4701, -3.0501, 1), pt(53.48, -3.06, 30, { newSegment: true }), pt(53.4801, -3.0601, 31)]);
    expect(xml.match(/<trkseg>/g)).toHaveLength(2);
    expect(xml.match(/<\/trkseg>/g)).toHaveLength(2);
    expect(await validate(xml)).toEqual({ valid: true, errors: [] });
  });

  it("leaves time out when the log had no clock (GPX 1.1 allows trkpt without time)", async () => {
    const xml = writeGpx({ name: "no clock", startedAt: null }, [pt(1, 2, 0, { altM: 5 }), pt(1.00001, 2, 0.2)]);
    expect(xml).not.toContain("<time>");
    expect(await validate(xml)).toEqual({ valid: true, errors: [] });
  });

  it("escapes the title and drops characters XML 1.0 cannot carry", async () => {
    const name = `<Loop> & "north" 'field' \u0007bell 💡`;
    const xml = writeGpx({ name, startedAt: null }, [pt(0.5, 0.5, 0)]);
    expect(xml).toContain("<name>&lt;Loop&gt; &amp; &quot;north&quot; &apos;field&apos; bell 💡</name>");
    expect(await validate(xml)).toEqual({ valid: true, errors: [] });
    expect(xmlText("a\u0000b\uFFFEc")).toBe("abc");
  });

  it("keeps coordinates inside the schema's ranges: lon 180 becomes -180, values are plain decimals", async () => {
    const xml = writeGpx({ name: "edge", startedAt: null }, [pt(89.99999999, 179.99999999, 0, { hdop: 1e-7, altM: -0.000001 }), pt(-90, -180, 1)]);
    // longitudeType: -180.0 <= value < 180.0; latitudeType: -90.0 <= value <= 90.0 (GPX 1.1 schema).
    expect(xml).toContain('lat="90" lon="-180"');
    expect(xml).not.toMatch(/\de-\d/);
    expect(await validate(xml)).toEqual({ valid: true, errors: [] });
  });

  it("an empty track is still a valid document, and chunked writing equals writing at once", async () => {
    expect(await validate(writeGpx({ name: "empty", startedAt: null }, []))).toEqual({ valid: true, errors: [] });
    const points = simPoints();
    const w = new GpxWriter({ name: "x", startedAt: new Date(0) });
    let chunked = w.head();
    for (let i = 0; i < points.length; i += 97) chunked += w.points(points.slice(i, i + 97));
    chunked += w.tail();
    expect(chunked).toBe(writeGpx({ name: "x", startedAt: new Date(0) }, points));
  });

  it("reads back through Sortie's own GPX parser: same positions, times and segment starts", async () => {
    const points = simPoints().slice(0, 200);
    points[120] = { ...points[120], newSegment: true };
    const xml = writeGpx({ name: "round trip", startedAt: new Date("2025-05-17T09:30:00Z") }, points);
    const lat: number[] = [];
    const t: number[] = [];
    const starts: number[] = [];
    await parseLog("gpx", chunksOf(xml), {
      onBatch: (b) => {
        for (let i = 0; i < b.length; i++) {
          if (b.segmentStart[i]) starts.push(lat.length);
          lat.push(b.columns.lat[i]);
          t.push(b.columns.tS[i]);
        }
      },
    });
    expect(lat.length).toBe(points.length);
    expect(lat[10]).toBeCloseTo(points[10].lat, 7);
    expect(t[150] - t[0]).toBeCloseTo(points[150].tS - points[0].tS, 3);
    expect(starts).toContain(120);
  });
});
