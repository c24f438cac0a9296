/**
 * Run exports over HTTP from the running test build, compared with SQL over the same samples and
 * events: the GPX validates against the GPX 1.1 schema (Topografix, ../shared/reference/gpx-1.1.xsd)
 * and keeps the log's track segments; the GeoJSON follows RFC 7946 (lon, lat order); the events CSV
 * has one defused row per event. Logs are our simulator's invented demo data.
 */
import fs from "node:fs";
import path from "node:path";
import { and, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { validateXML } from "xmllint-wasm";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { auditLog, memberships, runs, type Role } from "@/db/schema";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv, toGpx } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const XSD = path.resolve(__dirname, "../../../shared/reference/gpx-1.1.xsd");
const loop = demoCrew.routePlans[0].waypoints;
// Two laps at 40 Hz: about 28,000 samples, so the export reads several seq pages.
const csvSim = simulateRun({ seed: 31, waypoints: [...loop, ...loop.slice(1)], hz: 40 });
const START = new Date("2025-05-17T09:30:00.000Z");
const gpxSim = simulateRun({ seed: 32, waypoints: loop, hz: 1 });
/** The simulator's GPX with its one segment cut in two: the export must keep the cut. */
function twoSegmentGpx(): { xml: string; firstOfSecond: number } {
  const xml = toGpx(gpxSim, START, "two pieces");
  const lines = xml.split("\n");
  const pts = lines.map((l, i) => (l.includes("<trkpt") ? i : -1)).filter((i) => i >= 0);
  const cut = pts[Math.floor(pts.length / 2)];
  lines.splice(cut, 0, "    </trkseg>", "    <trkseg>");
  return { xml: lines.join("\n"), firstOfSecond: Math.floor(pts.length / 2) };
}

async function query<T>(q: ReturnType<typeof sql>): Promise<T[]> {
  const [rows] = (await db().execute(q)) as unknown as [T[]];
  return rows;
}

async function member(crewId: number, role: Role) {
  const who = await newLead(`export-${role}`);
  await db().insert(memberships).values({ crewId, userId: who.userId, role });
  const client = new Client();
  expect(await client.signIn(who.email, testPassword)).toBeNull();
  return { ...who, client };
}

const positioned = (runId: number) =>
  query<{ n: number }>(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${runId} AND lat IS NOT NULL AND lon IS NOT NULL AND NOT (lat = 0 AND lon = 0) AND (fix_type IS NULL OR fix_type <> 0)`).then((r) => Number(r[0].n));

describe("run exports", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  const c = new Client();
  let observer: Awaited<ReturnType<typeof member>>;
  let csvRun: number;
  let gpxRun: number;
  let firstOfSecond: number;

  beforeAll(async () => {
    lead = await newLead("export");
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const a = await uploadLog(c, "export-laps.csv", toCsv(csvSim));
    const g = twoSegmentGpx();
    firstOfSecond = g.firstOfSecond;
    const b = await uploadLog(c, "export-track.gpx", g.xml, { contentType: "application/gpx+xml" });
    for (const id of [a.runId, b.runId]) expect((await settledRun(c, id)).status).toBe("ready");
    csvRun = a.runId;
    gpxRun = b.runId;
    observer = await member(lead.crewId, "observer");
  });

  it("GPX: an observer downloads a track the GPX 1.1 schema accepts, one trkpt per positioned sample", async () => {
    const res = await observer.client.get(`/api/runs/${csvRun}/export/track.gpx`);
    expect(res.status, await res.clone().text().then((t) => t.slice(0, 300))).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^application\/gpx\+xml/);
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="[A-Za-z0-9._-]+\.gpx"; filename\*=UTF-8''/);
    expect(res.headers.get("cache-control")).toBe("private, no-store");
    const xml = await res.text();
    const v = await validateXML({ xml: { fileName: "run.gpx", contents: xml }, schema: { fileName: "gpx.xsd", contents: fs.readFileSync(XSD, "utf8") }, maxMemoryPages: 16384 });
    expect(v.errors.slice(0, 3).map((e) => e.rawMessage)).toEqual([]);
    expect(v.valid).toBe(true);
    expect((xml.match(/<trkpt /g) ?? []).length).toBe(await positioned(csvRun));
    // This CSV carries seconds only, no clock: no invented dates.
    const [run] = await db().select({ startedAt: runs.startedAt }).from(runs).where(eq(runs.id, csvRun));
    expect(run.startedAt).toBeNull();
    expect(xml).not.toContain("<time>");
    const [first] = await query<{ lat: number; lon: number }>(sql`SELECT lat, lon FROM samples WHERE run_id = ${csvRun} AND lat IS NOT NULL ORDER BY seq LIMIT 1`);
    expect(xml).toContain(`<trkpt lat="${Number(Number(first.lat).toFixed(7))}" lon="${Number(Number(first.lon).toFixed(7))}">`);
  });

  it("GPX: keeps the log's segments and its clock (start + seconds, ISO 8601)", async () => {
    const xml = await (await c.get(`/api/runs/${gpxRun}/export/track.gpx`)).text();
    const segs = xml.split("<trkseg>").slice(1);
    expect(segs).toHaveLength(2);
    expect((segs[0].match(/<trkpt /g) ?? []).length).toBe(firstOfSecond);
    const times = [...xml.matchAll(/<time>([^<]+)<\/time>/g)].map((m) => m[1]);
    // metadata time, then every point: the simulator's timestamps come back as written.
    expect(times[0]).toBe(START.toISOString());
    expect(times[1]).toBe(START.toISOString());
    expect(times[2]).toBe(new Date(START.getTime() + 1000).toISOString());
    expect(xml).toMatch(/<sat>\d+<\/sat><hdop>[\d.]+<\/hdop>/);
  });

  it("GeoJSON: a FeatureCollection of LineStrings in lon, lat order (RFC 7946 §3.1.1, §3.1.4)", async () => {
    const res = await c.get(`/api/runs/${gpxRun}/export/track.geojson`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^application\/geo\+json/);
    expect(res.headers.get("content-disposition")).toMatch(/\.geojson"; filename\*=/);
    const doc = (await res.json()) as { type: string; features: { type: string; geometry: { type: string; coordinates: number[][] }; properties: Record<string, unknown> }[] };
    expect(doc.type).toBe("FeatureCollection");
    expect(doc.features.map((f) => f.geometry.type)).toEqual(["LineString", "LineString"]);
    for (const f of doc.features) expect(f.geometry.coordinates.length).toBeGreaterThanOrEqual(2);
    const total = doc.features.reduce((s, f) => s + f.geometry.coordinates.length, 0);
    expect(total).toBe(await positioned(gpxRun));
    const [first] = await query<{ lat: number; lon: number }>(sql`SELECT lat, lon FROM samples WHERE run_id = ${gpxRun} ORDER BY seq LIMIT 1`);
    const [lon, lat] = doc.features[0].geometry.coordinates[0];
    expect(lon).toBeCloseTo(Number(first.lon), 7);
    expect(lat).toBeCloseTo(Number(first.lat), 7);
    expect(doc.features[0].properties.startTime).toBe(START.toISOString());
  });

  it("events CSV: one row per stored event, numbers as numbers, text defused (OWASP CSV Injection)", async () => {
    const res = await observer.client.get(`/api/runs/${csvRun}/export/events.csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/-events\.csv"; filename\*=UTF-8''.*-events\.csv$/);
    const text = await res.text();
    const lines = text.replace(/^\uFEFF/, "").trimEnd().split("\r\n");
    expect(lines[0]).toBe("kind,start_s,end_s,duration_s,peak,threshold,unit,lat,lon,distance_from_home_m,waypoint");
    const stored = await query<{ kind: string; start_s: number; peak: number | null }>(sql`SELECT kind, start_s, peak FROM events WHERE run_id = ${csvRun} ORDER BY start_s, id`);
    expect(stored.length).toBeGreaterThan(0);
    expect(lines.length - 1).toBe(stored.length);
    const lost = stored.findIndex((e) => e.kind === "link-lost");
    expect(lost).toBeGreaterThanOrEqual(0);
    const cells = lines[lost + 1].split(",");
    expect(cells[0]).toBe('"link-lost"');
    expect(Number(cells[1])).toBeCloseTo(Number(stored[lost].start_s), 3);
  });

  it("names the file safely from the title, whatever the title holds", async () => {
    await db().update(runs).set({ title: '../../etc/=cmd "north" Überflug' }).where(eq(runs.id, csvRun));
    const d = (await c.get(`/api/runs/${csvRun}/export/events.csv`)).headers.get("content-disposition")!;
    // No path survives in either name; the UTF-8 one keeps the letters (RFC 6266, RFC 5987).
    expect(d).toBe(`attachment; filename="etc-cmd-north-Uberflug-events.csv"; filename*=UTF-8''etc-%3Dcmd%20-north-%20%C3%9Cberflug-events.csv`);
  });

  it("records each export in the audit log", async () => {
    const rows = await db().select().from(auditLog).where(and(eq(auditLog.action, "run.exported"), eq(auditLog.targetId, String(csvRun))));
    const formats = rows.map((r) => (r.detail as { format: string }).format);
    expect(formats).toEqual(expect.arrayContaining(["gpx", "events-csv"]));
    expect(rows.some((r) => r.actorId === observer.userId && r.crewId === lead.crewId)).toBe(true);
  });

  it("refuses signed-out callers (401), other crews (404) and runs that are not ready (409)", async () => {
    const outsider = await newLead("export-outsider");
    const o = new Client();
    expect(await o.signIn(outsider.email, testPassword)).toBeNull();
    for (const f of ["track.gpx", "track.geojson", "events.csv"]) {
      expect((await new Client().get(`/api/runs/${csvRun}/export/${f}`)).status).toBe(401);
      expect((await o.get(`/api/runs/${csvRun}/export/${f}`)).status).toBe(404);
      expect((await c.get(`/api/runs/999999999/export/${f}`)).status).toBe(404);
    }
    const broken = await uploadLog(c, "broken-export.csv", "time_s,latitude\nsoon,53\n");
    expect((await settledRun(c, broken.runId)).status).toBe("failed");
    expect((await c.get(`/api/runs/${broken.runId}/export/track.gpx`)).status).toBe(409);
  });
});
