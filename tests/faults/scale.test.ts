/**
 * Past one machine, and under load: two app instances on different ports share one MariaDB and
 * one object store, as they would behind a load balancer.
 *
 * OWASP ASVS 4.0.3:
 * - V3.2.x / V3.5.x — sessions are signed, stateless tokens: one made by instance A is honoured
 *   by instance B; nothing about a session lives in one process.
 * - V2.2.1 — anti-automation on sign-in is shared: failed attempts on A and B add up.
 * - V11.1.4 (business logic limits) — the ingest queue is bounded per instance; a burst waits in
 *   MariaDB rather than in a process that could lose it.
 *
 * Load figures are reported (p50/p95/max read latency, ingest wall time), never asserted: timings
 * belong in benchmarks. What is asserted is correctness under load: every read answers 200, every
 * run becomes ready, and every run holds exactly its log's rows.
 */
import { sql } from "drizzle-orm";
import { quantileSorted } from "simple-statistics";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import type { AppServer } from "@/scripts/lib/app-server";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";
import { FaultStack, faults, makeLog, report, scale } from "./harness";

let stack: FaultStack;
let a: AppServer;
let b: AppServer;
const portA = faults.appPort;
const portB = faults.appPort + 1;

beforeAll(async () => {
  stack = await FaultStack.start();
  a = await stack.app(portA);
  // B serves requests only: whatever B accepts must be read by A's worker through the shared queue.
  b = await stack.app(portB, { BACKGROUND_JOBS: "off" });
}, 180_000);

afterAll(async () => {
  await stack?.stop();
}, 60_000);

async function samplesStored(runId: number): Promise<number> {
  const [rows] = await db().execute(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${runId}`);
  return Number((rows as unknown as { n: number }[])[0].n);
}

async function claimedBy(runId: number): Promise<string | null> {
  const [rows] = await db().execute(sql`SELECT claimed_by FROM ingest_jobs WHERE run_id = ${runId}`);
  return (rows as unknown as { claimed_by: string | null }[])[0]?.claimed_by ?? null;
}

describe("two app instances, one database and one store", () => {
  it("signs in on one instance, uploads on the other, and the shared queue reads the log", async () => {
    const lead = await newLead("two-instances");
    const onA = new Client(undefined, a.url);
    expect(await onA.signIn(lead.email, testPassword)).toBeNull();
    // The same browser, its next request routed to B.
    const onB = onA.withBase(b.url);
    const me = await onB.get("/api/me");
    expect(me.status).toBe(200);
    expect(((await me.json()) as { user: { email: string } }).user.email).toBe(lead.email);

    const rows = 2_000;
    const up = await uploadLog(onB, "two-instances.csv", await makeLog(rows, 11));
    const run = await settledRun(onA, up.runId, 60_000);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(rows);
    expect(await samplesStored(up.runId)).toBe(rows);
    // B runs no worker, so A's process read it.
    expect(await claimedBy(up.runId)).toContain(`:${a.process.pid}:`);
    // And B serves the debrief of a run A read.
    expect((await onB.get(`/runs/${up.runId}`)).status).toBe(200);
  });

  it("counts failed sign-ins on both instances together", async () => {
    const lead = await newLead("shared-limiter");
    // LOGIN_MAX_FAILURES is 4 on this stack: two failures on each instance use it up.
    for (const url of [a.url, b.url, a.url, b.url]) {
      expect(await new Client(undefined, url).signIn(lead.email, "not the password")).toBe("CredentialsSignin");
    }
    expect(await new Client(undefined, b.url).signIn(lead.email, testPassword)).toBe("RateLimited");
    expect(await new Client(undefined, a.url).signIn(lead.email, testPassword)).toBe("RateLimited");
  });
});

describe(`load: ${scale.ingests} concurrent ingests and ${scale.reads} concurrent debrief reads`, () => {
  it("reads every log exactly and answers every read while the ingests run", async () => {
    // Both instances read logs now.
    await b.stop();
    b = await stack.app(portB);
    const lead = await newLead("load");
    const onA = new Client(undefined, a.url);
    expect(await onA.signIn(lead.email, testPassword)).toBeNull();
    const onB = onA.withBase(b.url);

    // One run to read while the others are being ingested.
    const target = await uploadLog(onA, "load-target.csv", await makeLog(5_000, 999));
    expect((await settledRun(onA, target.runId, 60_000)).status).toBe("ready");

    // The baseline, measured in the same run: the same reads one at a time on an idle stack.
    const pagePath = `/runs/${target.runId}`;
    const seriesPath = `/api/runs/${target.runId}/series?fields=rssiDbm,lqPct,voltageV&points=2000`;
    const timedRead = async (client: Client, path: string) => {
      const s = performance.now();
      const res = await client.get(path);
      await res.arrayBuffer();
      expect(res.status).toBe(200);
      return performance.now() - s;
    };
    const idlePage: number[] = [];
    const idleSeries: number[] = [];
    for (let i = 0; i < 20; i++) {
      idlePage.push(await timedRead(i % 2 ? onB : onA, pagePath));
      idleSeries.push(await timedRead(i % 2 ? onB : onA, seriesPath));
    }

    const logs: { name: string; body: string }[] = [];
    for (let i = 0; i < scale.ingests; i++) logs.push({ name: `load-${i}.csv`, body: await makeLog(scale.rowsPerLog, 1_000 + i) });
    const t0 = Date.now();
    const uploads = Promise.all(logs.map((l, i) => uploadLog(i % 2 ? onB : onA, l.name, l.body)));

    // Debrief reads as a browser makes them: the page, then its chart series, spread over both instances.
    const latencies: number[] = [];
    const pageMs: number[] = [];
    const seriesMs: number[] = [];
    let failures = 0;
    for (let round = 0; round < scale.readRounds; round++) {
      await Promise.all(
        Array.from({ length: scale.reads }, async (_, i) => {
          const client = i % 2 ? onB : onA;
          const page = i % 4 < 2;
          const path = page ? pagePath : seriesPath;
          const s = performance.now();
          const res = await client.get(path);
          await res.arrayBuffer();
          const ms = performance.now() - s;
          latencies.push(ms);
          (page ? pageMs : seriesMs).push(ms);
          if (res.status !== 200) failures++;
        }),
      );
    }
    const uploaded = await uploads;
    const settled = await Promise.all(uploaded.map((u) => settledRun(onA, u.runId, scale.timeoutMs)));
    const ingestWallS = (Date.now() - t0) / 1000;

    expect(failures).toBe(0);
    for (const r of settled) {
      expect(r.status, r.error ?? "").toBe("ready");
      expect(r.sampleCount).toBe(scale.rowsPerLog);
    }
    for (const u of uploaded) expect(await samplesStored(u.runId)).toBe(scale.rowsPerLog);

    const owners = await Promise.all(uploaded.map((u) => claimedBy(u.runId)));
    const byA = owners.filter((o) => o?.includes(`:${a.process.pid}:`)).length;
    const byB = owners.filter((o) => o?.includes(`:${b.process.pid}:`)).length;
    expect(byA + byB).toBe(scale.ingests);
    // Both instances' workers took part, and each log was read exactly once.
    expect(byA).toBeGreaterThan(0);
    expect(byB).toBeGreaterThan(0);
    const [attemptRows] = await db().execute(sql`SELECT attempts FROM ingest_jobs WHERE run_id IN (${sql.join(uploaded.map((u) => sql`${u.runId}`), sql`, `)})`);
    expect((attemptRows as unknown as { attempts: number }[]).map((r) => r.attempts)).toEqual(uploaded.map(() => 1));

    const sorted = [...latencies].sort((x, y) => x - y);
    const q = (xs: number[], p: number) => quantileSorted([...xs].sort((x, y) => x - y), p);
    const p95 = (xs: number[]) => Math.round(q(xs, 0.95));
    report("load", {
      ingests: scale.ingests,
      rowsPerLog: scale.rowsPerLog,
      reads: latencies.length,
      readFailures: failures,
      readP50Ms: Math.round(quantileSorted(sorted, 0.5)),
      readP95Ms: Math.round(quantileSorted(sorted, 0.95)),
      readMaxMs: Math.round(sorted[sorted.length - 1]),
      pageP95Ms: p95(pageMs),
      seriesP95Ms: p95(seriesMs),
      idlePageMedianMs: Math.round(q(idlePage, 0.5)),
      idleSeriesMedianMs: Math.round(q(idleSeries, 0.5)),
      // How much slower a read is at the 95th percentile of the burst than alone on an idle stack.
      pageP95OverIdle: Number((q(pageMs, 0.95) / q(idlePage, 0.5)).toFixed(1)),
      seriesP95OverIdle: Number((q(seriesMs, 0.95) / q(idleSeries, 0.5)).toFixed(1)),
      ingestWallS: Number(ingestWallS.toFixed(1)),
      jobsReadByA: byA,
      jobsReadByB: byB,
    });
  });
});
