import fs from "node:fs";
import path from "node:path";
import { XMLParser } from "fast-xml-parser";
import { describe, expect, it } from "vitest";
import { GPX_REFERENCE_DIR, parseErrorOf } from "@/tests/helpers/parse-errors";

import { parseGpxRoutePlan } from "@/lib/parsers/gpx";
import { ParseError } from "@/lib/parsers/types";

const GPX_DIR = GPX_REFERENCE_DIR;
const readRef = (file: string) => fs.readFileSync(path.join(GPX_DIR, file), "utf8");

const errorOf = parseErrorOf;

/** Independent reading with fast-xml-parser of a list of point elements under the <gpx> root. */
function independentPoints(xml: string, pick: (gpx: Record<string, unknown>) => unknown) {
  const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: "@", parseTagValue: false, isArray: (n) => ["rte", "rtept", "wpt"].includes(n) });
  const pts = pick(parser.parse(xml).gpx) as Record<string, string>[];
  return pts.map((p) => ({ name: p.name, lat: Number(p["@lat"]), lon: Number(p["@lon"]), ele: p.ele }));
}

describe("parseGpxRoutePlan", () => {
  it("reads all 55 route points in order with their names (gpxpy route.gpx)", () => {
    const xml = readRef("gpxpy_route.gpx");
    const ref = independentPoints(xml, (g) => (g.rte as Record<string, unknown>[])[0].rtept);
    const plan = parseGpxRoutePlan(xml);
    expect(plan.source).toBe("rte");
    expect(plan.name).toBeNull();
    expect(plan.waypoints).toHaveLength(55);
    expect(plan.waypoints).toEqual(ref.map((p) => ({ name: p.name, lat: p.lat, lon: p.lon })));
    expect(plan.waypoints[0]).toEqual({ name: "#001", lat: 45.2787641494, lon: 13.726695478 });
  });

  it("falls back to the waypoint list when there is no route (gpxpy cerknicko-jezero.gpx, GPX 1.0)", () => {
    const xml = readRef("gpxpy_cerknicko-jezero.gpx");
    const ref = independentPoints(xml, (g) => g.wpt);
    const plan = parseGpxRoutePlan(xml);
    expect(plan.source).toBe("wpt");
    expect(plan.waypoints.map((w) => w.name)).toEqual(ref.map((p) => p.name));
    expect(plan.waypoints[0]).toEqual({ name: "001", lat: 45.772163216, lon: 14.357652292 }); // the first waypoint has no <ele>
    expect(plan.waypoints[1].altM).toBe(-0.11438); // the negative placeholder height is kept as written
  });

  it("names unnamed points WP1, WP2… and takes the route's <name> and <ele>", () => {
    const xml = `<gpx xmlns="http://www.topografix.com/GPX/1/1"><rte><name> Survey A </name>
      <rtept lat="1" lon="2"><ele>10</ele></rtept><rtept lat="3" lon="4"><name>Pylon</name><ele></ele></rtept><rtept lat="5" lon="6"/></rte></gpx>`;
    expect(parseGpxRoutePlan(xml)).toEqual({
      name: "Survey A",
      source: "rte",
      waypoints: [
        { name: "WP1", lat: 1, lon: 2, altM: 10 },
        { name: "Pylon", lat: 3, lon: 4 },
        { name: "WP3", lat: 5, lon: 6 },
      ],
    });
  });

  it("uses the first route with at least two points, skipping an empty one", () => {
    const xml = '<gpx><rte/><rte><rtept lat="1" lon="1"/><rtept lat="2" lon="2"/></rte><rte><rtept lat="9" lon="9"/><rtept lat="8" lon="8"/></rte></gpx>';
    expect(parseGpxRoutePlan(xml).waypoints.map((w) => w.lat)).toEqual([1, 2]);
  });

  it("names a waypoint list after the GPX 1.1 <metadata><name>", () => {
    const xml = '<gpx><metadata><name>Field day</name></metadata><wpt lat="1" lon="1"/><wpt lat="2" lon="2"/></gpx>';
    expect(parseGpxRoutePlan(xml)).toMatchObject({ name: "Field day", source: "wpt" });
  });

  it("ignores a leading BOM", () => {
    expect(parseGpxRoutePlan('\uFEFF<gpx><wpt lat="1" lon="1"/><wpt lat="2" lon="2"/></gpx>').waypoints).toHaveLength(2);
  });

  it("throws when there is only a track (georust garmin-activity.gpx has an empty <rte/>)", () => {
    const err = errorOf(() => parseGpxRoutePlan(readRef("georust-gpx_garmin-activity.gpx")));
    expect(err.expected).toBe("a <rte> or at least 2 <wpt>");
  });

  it("throws when there is a single waypoint", () => {
    expect(() => parseGpxRoutePlan('<gpx><wpt lat="1" lon="1"/></gpx>')).toThrow(ParseError);
  });

  it("throws naming the line of a point with an out-of-range latitude", () => {
    const err = errorOf(() => parseGpxRoutePlan('<gpx>\n<rte>\n<rtept lat="1" lon="1"/>\n<rtept lat="95" lon="1"/>\n</rte></gpx>'));
    expect(err.line).toBe(4);
    expect(err.message).toContain("Route point 2");
  });

  it("throws for malformed XML and for a root other than <gpx>", () => {
    expect(errorOf(() => parseGpxRoutePlan("<gpx><rte></gpx>")).message).toMatch(/not well-formed XML/);
    expect(errorOf(() => parseGpxRoutePlan("<kml/>")).expected).toBe("a <gpx> root element");
  });
});
