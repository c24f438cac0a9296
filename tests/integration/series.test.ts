/**
 * Series, track and points endpoints over a log that went through the real pipeline (upload →
 * S3 → parser → MariaDB → levels), answered over HTTP by the running test build. The log is our
 * own simulator's output (demo data); the checks compare the endpoints with SQL over the same
 * samples table.
 */
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import type { PointsResponse, SeriesResponse, TrackResponse } from "@/lib/series/types";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const loop = demoCrew.routePlans[0].waypoints;
// Four laps at 20 Hz: about 14,000 samples, enough for the levels to be used.
const sim = simulateRun({ seed: 9, waypoints: [...loop, ...loop.slice(1), ...loop.slice(1), ...loop.slice(1)], hz: 20 });
const csv = toCsv(sim);

async function query<T>(q: ReturnType<typeof sql>): Promise<T[]> {
  const [rows] = (await db().execute(q)) as unknown as [T[]];
  return rows;
}

const levelRows = async (runId: number) => Number((await query<{ n: number }>(sql`SELECT COUNT(*) AS n FROM series_levels WHERE run_id = ${runId}`))[0].n);

const finite = (a: (number | null)[] | undefined) => (a ?? []).filter((v): v is number => v !== null);
/** The same 32-bit float: the samples table keeps sensor values as FLOAT. */
const f32 = (v: number | string | null) => Math.fround(Number(v));

describe("series endpoints", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  let c: Client;
  let runId: number;

  beforeAll(async () => {
    lead = await newLead("series");
    c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const plan = await c.post("/api/route-plans", { name: "Four laps", waypoints: loop.map((w) => ({ name: w.name, lat: w.lat, lon: w.lon })) });
    expect(plan.status).toBe(201);
    const up = await uploadLog(c, "laps.csv", csv, { routePlanId: (await plan.json()).id });
    const run = await settledRun(c, up.runId);
    expect(run.error).toBeNull();
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(sim.length);
    runId = up.runId;
  });

  it("stores levels with the samples", async () => {
    expect(await levelRows(runId)).toBeGreaterThan(10);
  });

  it("whole run: decimated, with min and max equal to SQL MIN() and MAX() over the samples", async () => {
    const res = await c.get(`/api/runs/${runId}/series?fields=rssiDbm,lat,voltageV,distanceFromHomeM,xteM&points=2000`);
    expect(res.status, await res.clone().text()).toBe(200);
    expect(res.headers.get("cache-control")).toMatch(/^private/);
    expect(res.headers.get("etag")).toBeTruthy();
    const s = (await res.json()) as SeriesResponse;
    expect(s.runId).toBe(runId);
    expect(s.from).toBe(0);
    expect(s.to).toBeCloseTo(sim[sim.length - 1].t, 2);
    expect(s.resolution).toBe(16);
    expect(s.t.length).toBeLessThanOrEqual(2000);
    expect(s.absent).toEqual([]);
    for (const f of ["rssiDbm", "lat", "voltageV", "distanceFromHomeM", "xteM"] as const) expect(s.values[f]).toHaveLength(s.t.length);
    for (let i = 1; i < s.t.length; i++) expect(s.t[i]).toBeGreaterThanOrEqual(s.t[i - 1]);

    const [m] = await query<{ rmin: number; rmax: number; latmin: number; latmax: number; vmin: number; vmax: number }>(
      sql`SELECT MIN(rssi_dbm) AS rmin, MAX(rssi_dbm) AS rmax, MIN(lat) AS latmin, MAX(lat) AS latmax, MIN(voltage_v) AS vmin, MAX(voltage_v) AS vmax
          FROM samples WHERE run_id = ${runId}`,
    );
    const rssi = finite(s.values.rssiDbm);
    expect(f32(Math.min(...rssi))).toBe(f32(m.rmin));
    expect(f32(Math.max(...rssi))).toBe(f32(m.rmax));
    const volts = finite(s.values.voltageV);
    expect(f32(Math.min(...volts))).toBe(f32(m.vmin));
    expect(f32(Math.max(...volts))).toBe(f32(m.vmax));
    // Coordinates are DOUBLE in the table and in the levels: exactly equal.
    const lat = finite(s.values.lat);
    expect(Math.min(...lat)).toBe(Number(m.latmin));
    expect(Math.max(...lat)).toBe(Number(m.latmax));
    // Derived from the analysis: distance from home reaches the summary's maximum.
    const [summary] = await query<{ d: number }>(sql`SELECT JSON_EXTRACT(summary, '$.maxDistanceFromHomeM') AS d FROM runs WHERE id = ${runId}`);
    expect(Math.max(...finite(s.values.distanceFromHomeM))).toBeCloseTo(Number(summary.d), 0);
    expect(finite(s.values.xteM).length).toBeGreaterThan(100);
  });

  it("zoomed to a few seconds: every sample as stored", async () => {
    const s = (await (await c.get(`/api/runs/${runId}/series?fields=rssiDbm,lqPct,xteM&from=100&to=103`)).json()) as SeriesResponse;
    expect(s.resolution).toBe("raw");
    const rows = await query<{ t_s: number; rssi_dbm: number | null; lq_pct: number | null }>(
      sql`SELECT t_s, rssi_dbm, lq_pct FROM samples WHERE run_id = ${runId} AND t_s BETWEEN 100 AND 103 ORDER BY seq`,
    );
    expect(rows.length).toBe(61);
    expect(s.t).toEqual(rows.map((r) => Number(r.t_s)));
    expect(s.values.rssiDbm!.map(f32)).toEqual(rows.map((r) => f32(r.rssi_dbm)));
    expect(s.values.lqPct!.map(f32)).toEqual(rows.map((r) => f32(r.lq_pct)));
    expect(s.values.xteM).toHaveLength(61);
  });

  it("track: positions in time order with the link metric", async () => {
    const res = await c.get(`/api/runs/${runId}/track`);
    expect(res.status).toBe(200);
    const tr = (await res.json()) as TrackResponse;
    expect(tr.metric).toEqual({ field: "lqPct", unit: "%" });
    expect(tr.t.length).toBe(tr.lat.length);
    expect(tr.t.length).toBe(tr.lon.length);
    expect(tr.t.length).toBe(tr.link.length);
    expect(tr.t.length).toBeGreaterThan(3000);
    expect(tr.t.length).toBeLessThanOrEqual(4000 + tr.breaks.length);
    for (let i = 1; i < tr.t.length; i++) expect(tr.t[i]).toBeGreaterThanOrEqual(tr.t[i - 1]);
    // The worst link of the run (the loss) is on the map.
    const [m] = await query<{ lq: number }>(sql`SELECT MIN(lq_pct) AS lq FROM samples WHERE run_id = ${runId}`);
    expect(Math.min(...finite(tr.link))).toBe(Number(m.lq));
  });

  it("points: actual samples where every field has a value", async () => {
    const res = await c.get(`/api/runs/${runId}/points?fields=rssiDbm,distanceFromHomeM&points=500`);
    expect(res.status).toBe(200);
    const p = (await res.json()) as PointsResponse;
    const [m] = await query<{ n: number }>(sql`SELECT COUNT(rssi_dbm) AS n FROM samples WHERE run_id = ${runId}`);
    // Distance from home is known from the first good fix on; nearly every sample here.
    expect(p.total).toBeLessThanOrEqual(Number(m.n));
    expect(p.total).toBeGreaterThan(Number(m.n) * 0.9);
    expect(p.t).toHaveLength(500);
    const seqs = p.t.slice(0, 20);
    const rows = await query<{ t_s: number; rssi_dbm: number }>(sql`SELECT t_s, rssi_dbm FROM samples WHERE run_id = ${runId} AND t_s IN (${sql.join(seqs, sql`, `)}) ORDER BY seq`);
    expect(rows.map((r) => f32(r.rssi_dbm))).toEqual(p.values.rssiDbm!.slice(0, 20).map(f32));
  });

  it("answers 304 to a current ETag, and lets a versioned URL be kept", async () => {
    const url = `/api/runs/${runId}/series?fields=altM`;
    const first = await c.get(url);
    const etag = first.headers.get("etag")!;
    expect(first.headers.get("cache-control")).toBe("private, no-cache");
    const again = await c.request(url, { headers: { "if-none-match": etag } });
    expect(again.status).toBe(304);
    const { version } = (await first.json()) as SeriesResponse;
    const kept = await c.get(`${url}&v=${version}`);
    expect(kept.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
  });

  it("rebuilds levels for a run stored without them", async () => {
    const before = (await (await c.get(`/api/runs/${runId}/series?fields=rssiDbm,distanceFromHomeM`)).json()) as SeriesResponse;
    await db().execute(sql`DELETE FROM series_levels WHERE run_id = ${runId}`);
    const res = await c.get(`/api/runs/${runId}/series?fields=rssiDbm,distanceFromHomeM`);
    expect(res.status).toBe(200);
    const after = (await res.json()) as SeriesResponse;
    expect(after.values.rssiDbm).toEqual(before.values.rssiDbm);
    // The rebuild runs the analysis again, so the derived values come back too.
    expect(after.absent).toEqual([]);
    expect(after.values.distanceFromHomeM).toEqual(before.values.distanceFromHomeM);
    expect(await levelRows(runId)).toBeGreaterThan(10);
    // A re-parse brings the derived values back.
    expect((await c.post(`/api/runs/${runId}/reparse`, {})).status).toBe(200);
    expect((await settledRun(c, runId)).status).toBe("ready");
    const reparsed = (await (await c.get(`/api/runs/${runId}/series?fields=distanceFromHomeM`)).json()) as SeriesResponse;
    expect(reparsed.absent).toEqual([]);
  });

  it("refuses bad queries, other crews, signed-out callers and runs that are not ready", async () => {
    const bad = await c.get(`/api/runs/${runId}/series?fields=rssiDbm,warp`);
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toMatch(/Unknown field "warp"/);
    expect((await c.get(`/api/runs/${runId}/series?fields=rssiDbm&from=5&to=1`)).status).toBe(422);
    expect((await c.get(`/api/runs/${runId}/series?fields=rssiDbm&points=1`)).status).toBe(422);
    expect((await c.get(`/api/runs/${runId}/points?fields=nope`)).status).toBe(422);

    const outsider = await newLead("series-outsider");
    const o = new Client();
    expect(await o.signIn(outsider.email, testPassword)).toBeNull();
    for (const path of [`/series?fields=rssiDbm`, `/track`, `/points?fields=rssiDbm`]) {
      expect((await o.get(`/api/runs/${runId}${path}`)).status).toBe(404);
      expect((await new Client().get(`/api/runs/${runId}${path}`)).status).toBe(401);
    }
    expect((await c.get(`/api/runs/999999999/track`)).status).toBe(404);

    // A failed run has no levels left and no series.
    const broken = await uploadLog(c, "broken.csv", csv.split("\n").map((l, i) => (i === 1 ? l.replace(/^[^,]+/, "soon") : l)).join("\n"));
    expect((await settledRun(c, broken.runId)).status).toBe("failed");
    expect(await levelRows(broken.runId)).toBe(0);
    const refused = await c.get(`/api/runs/${broken.runId}/series?fields=rssiDbm`);
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.message).toMatch(/could not be parsed/);
  });
});
