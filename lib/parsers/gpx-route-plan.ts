import type { Element } from "@xmldom/xmldom";
import { childElements, childText, pointCoordinates, readGpxDocument, toNumber } from "./gpx-dom";
import { ParseError } from "./types";
import { WarningLog } from "./warnings";

export interface GpxRoutePlan {
  /** The route's <name>; for a waypoint list the file's <metadata><name> (1.1) or <name> (1.0). */
  name: string | null;
  source: "rte" | "wpt";
  waypoints: { name: string; lat: number; lon: number; altM?: number }[];
}

/**
 * Reads a planned route from GPX text: the first <rte> that has at least two <rtept>, otherwise all
 * top-level <wpt> in document order. Each point is named by its <name>, else "WP1", "WP2"… by its
 * position; `altM` (metres) is set only when the point has a numeric <ele>.
 *
 * @param text the GPX document (a leading BOM is ignored)
 * @returns the route name, where the points came from, and the points in order
 * @throws {ParseError} for malformed XML or a root that is not <gpx>
 * @throws {ParseError} when there is neither a route nor a waypoint list with at least 2 points
 * @throws {ParseError} when a point has a missing or out-of-range lat/lon (with its line)
 * @example
 * parseGpxRoutePlan(gpxText).waypoints[0]; // => { name: "#001", lat: 45.27, lon: 13.73 }
 */
export function parseGpxRoutePlan(text: string): GpxRoutePlan {
  const { root, ns } = readGpxDocument(text.startsWith("\uFEFF") ? text.slice(1) : text, new WarningLog());
  const rte = childElements(root, "rte", ns).find((r) => childElements(r, "rtept", ns).length >= 2);
  if (rte) {
    return { name: nonEmpty(childText(rte, "name", ns)), source: "rte", waypoints: toWaypoints(childElements(rte, "rtept", ns), ns) };
  }
  const wpts = childElements(root, "wpt", ns);
  if (wpts.length >= 2) {
    const metadata = childElements(root, "metadata", ns)[0];
    const name = nonEmpty(metadata ? childText(metadata, "name", ns) : childText(root, "name", ns));
    return { name, source: "wpt", waypoints: toWaypoints(wpts, ns) };
  }
  throw new ParseError(
    "The GPX file has no route (<rte> with at least 2 <rtept>) and no list of at least 2 waypoints (<wpt>)",
    undefined,
    undefined,
    "a <rte> or at least 2 <wpt>",
  );
}

function toWaypoints(points: Element[], ns: string | null): GpxRoutePlan["waypoints"] {
  return points.map((p, i) => {
    const c = pointCoordinates(p);
    if (!c) {
      throw new ParseError(
        `Route point ${i + 1} has a missing or out-of-range latitude/longitude`,
        p.lineNumber,
        undefined,
        "lat within ±90 and lon within ±180",
      );
    }
    const altM = toNumber(childText(p, "ele", ns));
    const wp: GpxRoutePlan["waypoints"][number] = { name: nonEmpty(childText(p, "name", ns)) ?? `WP${i + 1}`, lat: c.lat, lon: c.lon };
    if (!Number.isNaN(altM)) wp.altM = altM;
    return wp;
  });
}

function nonEmpty(s: string | null): string | null {
  return s === null || s === "" ? null : s;
}
