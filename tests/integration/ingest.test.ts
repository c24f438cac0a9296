/**
 * Upload → storage → parse → MariaDB, through the running server with real s3rver and MariaDB.
 * The logs are our own simulator's output (demo data, not a reference) plus real GPX recordings
 * from ../shared/reference/gpx (see SOURCES.md there).
 */
import fs from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { createApiToken } from "@/lib/api-tokens";
import { acceptInvitation, inviteMember } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv, toGpx, toNmea } from "@/scripts/simulator/write-logs";
import { demoCrew } from "@/db/demo-crew";
import { demoLogs } from "@/scripts/simulator/demo-runs";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const sim = simulateRun({ seed: 5, waypoints: demoCrew.routePlans[0].waypoints });
const csv = toCsv(sim);
const csvRows = csv.trim().split("\n").length - 1;

async function sampleCount(runId: number): Promise<number> {
  const [rows] = (await db().execute(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${runId}`)) as unknown as [{ n: number }[]];
  return Number(rows[0].n);
}

describe("log ingest", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  let pilot: Client;

  beforeAll(async () => {
    lead = await newLead("ingest");
    const email = uniqueEmail("ingest-pilot");
    await inviteMember(lead.actor, lead.crewId, { email, role: "pilot" });
    await acceptInvitation(tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/")), { name: "Ingest Pilot", password: testPassword });
    pilot = new Client();
    expect(await pilot.signIn(email, testPassword)).toBeNull();
  });

  it("stores every row of a CSV log as a sample, in one run", async () => {
    const up = await uploadLog(pilot, "sim.csv", csv);
    expect(up.duplicate).toBe(false);
    const run = await settledRun(pilot, up.runId);
    expect(run.error).toBeNull();
    expect(run.status).toBe("ready");
    expect(run.format).toBe("csv");
    expect(run.sampleCount).toBe(csvRows);
    expect(await sampleCount(up.runId)).toBe(csvRows);
    // The first data row comes back from MariaDB as written.
    const first = csv.split("\n")[1].split(",");
    const [rows] = (await db().execute(sql`SELECT lat, lon, rssi_dbm, mode_index FROM samples WHERE run_id = ${up.runId} AND seq = 0`)) as unknown as [
      { lat: number; lon: number; rssi_dbm: number }[],
    ];
    expect(rows[0].lat).toBeCloseTo(Number(first[1]), 7);
    expect(rows[0].lon).toBeCloseTo(Number(first[2]), 7);
    expect(rows[0].rssi_dbm).toBeCloseTo(Number(first[9]), 1);
    expect(run.durationS).toBeCloseTo(sim[sim.length - 1].t, 2);
  });

  it("leads the same file uploaded again to the existing run", async () => {
    const a = await uploadLog(pilot, "again.csv", csv + "\n");
    const b = await uploadLog(pilot, "again-copy.csv", csv + "\n");
    expect(b.duplicate).toBe(true);
    expect(b.runId).toBe(a.runId);
  });

  it("re-parses the stored original with a corrected column map", async () => {
    const up = await uploadLog(pilot, "remap.csv", csv.replace("rssi_dbm", "signal"));
    const before = await settledRun(pilot, up.runId);
    const signal = before.columnMap!.columns.find((c) => c.header === "signal")!;
    expect(signal.field).toBe("ignore");
    const map = { ...before.columnMap!, columns: before.columnMap!.columns.map((c) => (c.header === "signal" ? { header: "signal", field: "rssi", unit: "dBm" } : c)) };
    const res = await pilot.post(`/api/runs/${up.runId}/reparse`, { columnMap: map });
    expect(res.status).toBe(200);
    const after = await settledRun(pilot, up.runId);
    expect(after.status).toBe("ready");
    expect(await sampleCount(up.runId)).toBe(csvRows);
    const [rows] = (await db().execute(sql`SELECT COUNT(rssi_dbm) AS n FROM samples WHERE run_id = ${up.runId}`)) as unknown as [{ n: number }[]];
    expect(Number(rows[0].n)).toBeGreaterThan(csvRows * 0.9);
  });

  it("leaves no samples behind when a re-parse fails", async () => {
    const up = await uploadLog(pilot, "reparse-fails.csv", csv.replace("MANUAL", "MANUAL3"));
    const good = await settledRun(pilot, up.runId);
    expect(await sampleCount(up.runId)).toBe(csvRows);
    const wrong = { ...good.columnMap!, columns: good.columnMap!.columns.map((c) => (c.field === "time" ? { ...c, unit: "iso" } : c)) };
    expect((await pilot.post(`/api/runs/${up.runId}/reparse`, { columnMap: wrong })).status).toBe(200);
    const failed = await settledRun(pilot, up.runId);
    expect(failed.status).toBe("failed");
    expect(failed.error).toMatch(/line 2/);
    expect(await sampleCount(up.runId)).toBe(0);
  });

  it("keeps a broken file with a clear message, no samples, and the original downloadable", async () => {
    const junk = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256));
    const up = await uploadLog(pilot, "junk.csv", junk);
    const run = await settledRun(pilot, up.runId);
    expect(run.status).toBe("failed");
    expect(run.error).toMatch(/text log|CSV|not/i);
    expect(await sampleCount(up.runId)).toBe(0);
    const dl = await pilot.get(`/api/runs/${up.runId}/original`);
    expect(dl.status).toBe(302);
    const original = Buffer.from(await (await fetch(dl.headers.get("location")!)).arrayBuffer());
    expect(original.equals(junk)).toBe(true);
  });

  it("names the line and column of a bad time value", async () => {
    const bad = csv.split("\n");
    bad[1] = bad[1].replace(/^[^,]+/, "soon");
    const run = await settledRun(pilot, (await uploadLog(pilot, "bad-time.csv", bad.join("\n"))).runId);
    expect(run.status).toBe("failed");
    expect(run.error).toMatch(/line 2/);
    expect(run.error).toMatch(/time/);
  });

  it("reads GPX and NMEA logs the same way", async () => {
    const start = new Date("2026-11-14T10:00:00Z");
    const gpx = await settledRun(pilot, (await uploadLog(pilot, "sim.gpx", toGpx(sim, start, "sim"), { contentType: "application/gpx+xml" })).runId);
    expect(gpx.status).toBe("ready");
    expect(gpx.format).toBe("gpx");
    const wholeSeconds = sim.filter((s) => Math.abs(s.t - Math.round(s.t)) < 1e-6).length;
    expect(gpx.sampleCount).toBe(wholeSeconds);
    expect(new Date(gpx.startedAt!).toISOString()).toBe(start.toISOString());
    const nmea = await settledRun(pilot, (await uploadLog(pilot, "sim.nmea", toNmea(sim, start), { contentType: "text/plain" })).runId);
    expect(nmea.status).toBe("ready");
    expect(nmea.format).toBe("nmea");
    expect(nmea.sampleCount).toBe(wholeSeconds);
  });

  it("turns an uploaded GPX route into a route plan", async () => {
    // gpxpy test suite's route.gpx (see ../shared/reference/gpx/SOURCES.md).
    const file = fs.readFileSync(path.resolve(process.cwd(), "../shared/reference/gpx/gpxpy_route.gpx"));
    const rtepts = (file.toString("utf8").match(/<rtept\b/g) ?? []).length;
    const created = await pilot.post("/api/uploads", { fileName: "route.gpx", size: file.length, contentType: "application/gpx+xml" });
    const { uploadId, putUrl, contentType } = await created.json();
    await fetch(putUrl, { method: "PUT", body: new Uint8Array(file), headers: { "content-type": contentType } });
    const res = await pilot.post("/api/route-plans", { uploadId, vehicleClass: "air" });
    expect(res.status, await res.clone().text()).toBe(201);
    const plan = (await (await pilot.get(`/api/route-plans/${(await res.json()).id}`)).json()).routePlan;
    expect(plan.waypoints).toHaveLength(rtepts);
    expect(plan.source).toBe("gpx");
  });

  it("refuses oversize and non-log uploads before any bytes are sent", async () => {
    const big = await pilot.post("/api/uploads", { fileName: "huge.csv", size: 3 * 1024 ** 3, contentType: "text/csv" });
    expect(big.status).toBe(422);
    expect((await big.json()).error.message).toMatch(/limit/);
    const png = await pilot.post("/api/uploads", { fileName: "photo.png", size: 1000, contentType: "image/png" });
    expect(png.status).toBe(422);
  });

  it("lets observers read runs but not upload, and hides runs from other crews", async () => {
    const up = await uploadLog(pilot, "visibility.csv", csv.replace("MANUAL", "MANUAL2"));
    await settledRun(pilot, up.runId);
    const outsider = await newLead("ingest-outsider");
    const { token } = await createApiToken(outsider.actor, "script");
    const other = new Client(token);
    for (const p of [`/api/runs/${up.runId}`, `/api/runs/${up.runId}/original`, `/api/runs/${up.runId}/preview`]) {
      expect((await other.get(p)).status, p).toBe(404);
    }
    expect((await other.post(`/api/runs/${up.runId}/reparse`, {})).status).toBe(404);
    expect((await other.post(`/api/uploads/${up.uploadId}/complete`, {})).status).toBe(404);

    const obsEmail = uniqueEmail("ingest-observer");
    await inviteMember(lead.actor, lead.crewId, { email: obsEmail, role: "observer" });
    await acceptInvitation(tokenFromLink(linkIn(await waitForMail(obsEmail, /invited/), "/invite/")), { name: "Obs", password: testPassword });
    const observer = new Client();
    expect(await observer.signIn(obsEmail, testPassword)).toBeNull();
    expect((await observer.get(`/api/runs/${up.runId}`)).status).toBe(200);
    expect((await observer.post("/api/uploads", { fileName: "x.csv", size: 10, contentType: "text/csv" })).status).toBe(403);
    expect((await observer.post(`/api/runs/${up.runId}/reparse`, {})).status).toBe(403);
  });

  it("has parsed the demo crew's seeded logs", async () => {
    // Only the seeded files: browser tests upload into the demo crew too.
    const names = demoLogs().map((l) => l.fileName);
    const [all] = (await db().execute(
      sql`SELECT r.status, r.format, r.sample_count, u.file_name FROM runs r JOIN crews c ON c.id = r.crew_id JOIN uploads u ON u.id = r.upload_id WHERE c.name = ${demoCrew.name}`,
    )) as unknown as [{ status: string; format: string; sample_count: number; file_name: string }[]];
    const rows = all.filter((r) => names.includes(r.file_name));
    // The rover's CSV, the bench failsafe test's CSV, the GPX track and the NMEA log.
    expect(rows.map((r) => r.format).sort()).toEqual(["csv", "csv", "gpx", "nmea"]);
    for (const r of rows) {
      expect(r.status).toBe("ready");
      expect(r.sample_count).toBeGreaterThan(100);
    }
    // Ingest stores the analysis: the rover log's events and verdict (our simulator's scenario).
    const [ev] = (await db().execute(
      sql`SELECT e.kind, r.verdict FROM events e JOIN runs r ON r.id = e.run_id JOIN uploads u ON u.id = r.upload_id
          JOIN crews c ON c.id = r.crew_id WHERE c.name = ${demoCrew.name} AND u.file_name = 'mudlark-flats-loop.csv'`,
    )) as unknown as [{ kind: string; verdict: string }[]];
    const kinds = new Set(ev.map((e) => e.kind));
    for (const k of ["link-fade", "link-lost", "failsafe", "return-to-home", "low-voltage", "waypoint-reached"]) expect(kinds.has(k), k).toBe(true);
    expect(ev[0].verdict).toBe("act");
  });
});

describe("multipart upload", () => {
  it("sends a large log in parts and stores it whole", async () => {
    // npm test sets the multipart threshold to 8 MiB and parts to 5 MiB (scripts/test.ts).
    const lead = await newLead("multipart");
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const laps = simulateRun({ seed: 8, waypoints: [...demoCrew.routePlans[0].waypoints, ...Array(10).fill(demoCrew.routePlans[0].waypoints.slice(1)).flat()] });
    const once = toCsv(laps);
    const moreRows = once.split("\n").slice(1).join("\n");
    let body = once;
    while (body.length < 12 * 1024 * 1024) body += moreRows;
    const bytes = Buffer.from(body);
    const created = await c.post("/api/uploads", { fileName: "big.csv", size: bytes.length, contentType: "text/csv" });
    expect(created.status).toBe(201);
    const { uploadId, multipart } = (await created.json()) as { uploadId: number; multipart: { partSize: number; parts: { partNumber: number; url: string }[] } };
    expect(multipart.parts).toHaveLength(Math.ceil(bytes.length / multipart.partSize));
    const etags: string[] = [];
    for (const p of multipart.parts) {
      const chunk = bytes.subarray((p.partNumber - 1) * multipart.partSize, p.partNumber * multipart.partSize);
      const put = await fetch(p.url, { method: "PUT", body: new Uint8Array(chunk) });
      expect(put.status).toBe(200);
      etags.push(put.headers.get("etag")!);
    }
    const done = await c.post(`/api/uploads/${uploadId}/complete`, { parts: etags });
    expect(done.status, await done.clone().text()).toBe(200);
    const run = await settledRun(c, (await done.json()).runId);
    // The file repeats its rows, so time goes backwards where a copy starts: warned, kept.
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(body.trim().split("\n").length - 1);
    const dl = await c.get(`/api/runs/${run.id}/original`);
    const original = Buffer.from(await (await fetch(dl.headers.get("location")!)).arrayBuffer());
    expect(original.equals(bytes)).toBe(true);
  });
});

describe("durable ingest queue (a reader that died)", () => {
  /** A fresh crew with one ready run of the shared CSV, made distinct by its mode text. */
  async function readyRun(label: string, mode: string) {
    const lead = await newLead(label);
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const up = await uploadLog(c, `${label}.csv`, csv.replace("HOLD", mode));
    const first = await settledRun(c, up.runId);
    expect(first.status).toBe("ready");
    return { c, up, first };
  }

  // The claim/heartbeat/sweep scheme is common practice for database-backed job queues; the
  // app server's worker sweeps every 2 s and treats a heartbeat older than INGEST_STALE_AFTER_S as dead.
  it("queues a job whose holder stopped sending heartbeats again, and the run becomes ready", async () => {
    const { c, up, first } = await readyRun("dead-reader", "HOLD3");
    expect(first.status).toBe("ready");
    // As a process that claimed the job and then died would leave it (its transaction rolled back).
    await db().execute(sql`UPDATE runs SET status = 'parsing', progress = 0.4 WHERE id = ${up.runId}`);
    await db().execute(
      sql`UPDATE ingest_jobs SET state = 'running', attempts = 1, claimed_by = 'gone:1:dead', heartbeat_at = NOW(3) - INTERVAL 1 HOUR WHERE run_id = ${up.runId}`,
    );
    const run = await settledRun(c, up.runId);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(first.sampleCount);
    const [rows] = await db().execute(sql`SELECT state, attempts, claimed_by FROM ingest_jobs WHERE run_id = ${up.runId}`);
    const job = (rows as unknown as { state: string; attempts: number; claimed_by: string | null }[])[0];
    expect(job.state).toBe("done");
    expect(job.attempts).toBe(2);
    expect(job.claimed_by).not.toBe("gone:1:dead");
  });

  it("fails the run with a re-parse hint once the job has used its attempts", async () => {
    const { c, up } = await readyRun("dead-thrice", "HOLD4");
    await db().execute(sql`UPDATE runs SET status = 'parsing' WHERE id = ${up.runId}`);
    await db().execute(
      sql`UPDATE ingest_jobs SET state = 'running', attempts = 3, claimed_by = 'gone:2:dead', heartbeat_at = NOW(3) - INTERVAL 1 HOUR WHERE run_id = ${up.runId}`,
    );
    const run = await settledRun(c, up.runId);
    expect(run.status).toBe("failed");
    expect(run.error).toMatch(/stopped 3 times.*re-parse/);
    expect(run.sampleCount).toBe(0);
    expect((await c.post(`/api/runs/${up.runId}/reparse`, {})).status).toBe(200);
    expect((await settledRun(c, up.runId)).status).toBe("ready");
  });

  it("gives a run marked in progress whose job already settled a new job", async () => {
    const { c, up, first } = await readyRun("reconcile", "HOLD5");
    // As a status write that landed while the job write was lost in an outage would leave it.
    await db().execute(sql`UPDATE runs SET status = 'queued' WHERE id = ${up.runId}`);
    await db().execute(sql`UPDATE ingest_jobs SET state = 'done', updated_at = NOW(3) - INTERVAL 1 MINUTE WHERE run_id = ${up.runId}`);
    // Reconciliation runs every 15 s on each instance and revives a run stuck on two passes in a row.
    const run = await settledRun(c, up.runId, 55_000);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(first.sampleCount);
  }, 75_000);

  it("settles a job, and writes to its run, only under the claim that holds it", async () => {
    const { up } = await readyRun("claim-guard", "HOLD7");
    const { holdsClaim, settleIngestJobInTransaction } = await import("@/lib/jobs/ingest-jobs");
    const { inConnectionTransaction } = await import("@/db/client");
    const { runs } = await import("@/db/schema");
    const { and, eq } = await import("drizzle-orm");
    // A live claim (fresh heartbeat) held by "holder"; the sweep leaves it alone.
    await db().execute(sql`UPDATE ingest_jobs SET state = 'running', claimed_by = 'holder#1', heartbeat_at = NOW(3) WHERE run_id = ${up.runId}`);
    const guarded = (token: string) => db().update(runs).set({ progress: 0.5 }).where(and(eq(runs.id, up.runId), holdsClaim(up.runId, token)));
    expect((await guarded("other#2"))[0].affectedRows).toBe(0);
    expect((await guarded("holder#1"))[0].affectedRows).toBe(1);
    expect(await inConnectionTransaction((conn) => settleIngestJobInTransaction(conn, up.runId, "other#2"))).toBe(false);
    const state = async () => ((await db().execute(sql`SELECT state FROM ingest_jobs WHERE run_id = ${up.runId}`))[0] as unknown as { state: string }[])[0].state;
    expect(await state()).toBe("running");
    expect(await inConnectionTransaction((conn) => settleIngestJobInTransaction(conn, up.runId, "holder#1"))).toBe(true);
    expect(await state()).toBe("done");
  });

  // The early exit: a reader whose claim is already gone does not even start.
  it("lets a reader that does not hold the claim change nothing", async () => {
    const { c, up, first } = await readyRun("lost-claim", "HOLD6");
    const { ingestRun } = await import("@/lib/ingest/ingest-run");
    expect(await ingestRun(up.runId, { token: "someone-else#000000" })).toEqual({ kind: "lost" });
    const after = await settledRun(c, up.runId);
    expect(after.status).toBe("ready");
    expect(after.sampleCount).toBe(first.sampleCount);
    const [rows] = await db().execute(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${up.runId}`);
    expect(Number((rows as unknown as { n: number }[])[0].n)).toBe(first.sampleCount);
  });
});
