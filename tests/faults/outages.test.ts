/**
 * Faults a crew's server will meet: the app killed mid-ingest, and MariaDB, the object store and
 * the mail server each going away and coming back. A crew's logs are its evidence: none of these
 * may lose an upload, leave half a run visible, or show anyone a stack trace.
 *
 * OWASP ASVS 4.0.3:
 * - V7.4.1 — a generic message is shown when an unexpected or security-sensitive error occurs
 *   (no stack traces, no internals) — the 503 page and JSON below.
 * - V11.1.2 / V11.1.3 (business logic flows in order, atomically) — a run's samples commit in one
 *   transaction with its state, so a crash leaves none of them visible.
 * - V12.1.x / V12.3.x (file handling) — the stored original survives every fault byte for byte.
 */
import { createHash } from "node:crypto";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import type { AppServer } from "@/scripts/lib/app-server";
import { readObject } from "@/lib/storage/objects";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { Client } from "../helpers/http";
import { waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { settledRun, uploadLog, type RunJson } from "../helpers/uploads";
import { FaultStack, faults, makeLog, report, scale, waitUntil } from "./harness";

let stack: FaultStack;
let app: AppServer;
let lead: Awaited<ReturnType<typeof newLead>>;
let c: Client;
let readyRunId: number;

const STACK_TRACE = /\bat (async )?[\w.<>]+ \(|node_modules|\.tsx?:\d+|Error: /;

beforeAll(async () => {
  stack = await FaultStack.start();
  app = await stack.app(faults.appPort);
  lead = await newLead("outages");
  c = new Client(undefined, app.url);
  expect(await c.signIn(lead.email, testPassword)).toBeNull();
  const up = await uploadLog(c, "outage-baseline.csv", await makeLog(3_000, 21));
  readyRunId = (await settledRun(c, up.runId, 60_000)).id;
}, 180_000);

afterAll(async () => {
  await stack?.stop();
}, 60_000);

async function one<T>(q: ReturnType<typeof sql>): Promise<T> {
  const [rows] = await db().execute(q);
  return (rows as unknown as T[])[0];
}

const samplesStored = async (runId: number) => Number((await one<{ n: number }>(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${runId}`)).n);

async function runJson(client: Client, runId: number): Promise<RunJson> {
  const res = await client.get(`/api/runs/${runId}`);
  expect(res.status).toBe(200);
  return ((await res.json()) as { run: RunJson }).run;
}

/** Opens `path` in Chromium with the signed-in session, checks `text` is on screen, and keeps a screenshot. */
async function lookAt(path: string, name: string, text: string | RegExp): Promise<void> {
  const { browser, close } = await launchBrowser();
  try {
    await browser.addCookies(c.cookieList().map((k) => ({ ...k, url: app.url })));
    const page = await browser.newPage();
    await page.goto(`${app.url}${path}`);
    await page.getByText(text).first().waitFor({ timeout: 15_000 });
    await page.screenshot({ path: screenshotPath(name), fullPage: true });
  } finally {
    await close();
  }
}

async function sha256OfStored(objectKey: string): Promise<string> {
  const h = createHash("sha256");
  for await (const chunk of await readObject(objectKey)) h.update(chunk as Buffer);
  return h.digest("hex");
}

describe("the app server killed in the middle of an ingest", () => {
  it("shows no partial samples, keeps the original, and reads the run again after the restart", async () => {
    const rows = scale.crashRows;
    const body = await makeLog(rows, 31);
    const up = await uploadLog(c, "killed-mid-read.csv", body);
    // Wait until the log is being read and part of it has gone into the (uncommitted) load.
    await waitUntil("the ingest to be under way", async () => {
      const r = await runJson(c, up.runId);
      return r.status === "parsing" && r.progress > 0.05;
    }, 60_000, 25);
    const killedAt = Date.now();
    await stack.kill(app);

    // Nothing of the interrupted load is visible (this would fail if samples were committed in
    // batches rather than in the run's one transaction), and the run does not claim to be ready.
    expect(await samplesStored(up.runId)).toBe(0);
    const row = await one<{ status: string; sample_count: number; object_key: string; sha256: string }>(
      sql`SELECT r.status, r.sample_count, u.object_key, u.sha256 FROM runs r JOIN uploads u ON u.id = r.upload_id WHERE r.id = ${up.runId}`,
    );
    expect(["parsing", "analysing"]).toContain(row.status);
    expect(row.sample_count).toBe(0);
    // The original is intact: the stored object hashes to the bytes we sent.
    const sent = createHash("sha256").update(body).digest("hex");
    expect(row.sha256).toBe(sent);
    expect(await sha256OfStored(row.object_key)).toBe(sent);

    // Restart: the job's heartbeat has stopped, so the new process's sweep queues it again.
    app = await stack.app(faults.appPort);
    c = c.withBase(app.url);
    const run = await settledRun(c, up.runId, scale.timeoutMs);
    expect(run.status, run.error ?? "").toBe("ready");
    expect(run.sampleCount).toBe(rows);
    expect(await samplesStored(up.runId)).toBe(rows);
    // Settled in the same commit as the samples (lib/jobs/ingest-jobs.ts), so no wait is needed.
    const job = await one<{ state: string; attempts: number }>(sql`SELECT state, attempts FROM ingest_jobs WHERE run_id = ${up.runId}`);
    expect(job.state).toBe("done");
    expect(job.attempts).toBeGreaterThanOrEqual(2);
    report("crash", { rows, recoveredAfterS: Number(((Date.now() - killedAt) / 1000).toFixed(1)) });
  });
});

describe("the app server stopped (SIGTERM) in the middle of an ingest", () => {
  it("hands the log back to the queue at once, without using an attempt, and reads it after the restart", async () => {
    const rows = scale.crashRows;
    const up = await uploadLog(c, "stopped-mid-read.csv", await makeLog(rows, 33));
    await waitUntil("the ingest to be under way", async () => {
      const r = await runJson(c, up.runId);
      return r.status === "parsing" && r.progress > 0.05;
    }, 60_000, 25);
    await app.stop();

    // Handed back by the stopping server itself, not by a sweep: no other instance is running.
    const job = await one<{ state: string; attempts: number; claimed_by: string | null }>(
      sql`SELECT state, attempts, claimed_by FROM ingest_jobs WHERE run_id = ${up.runId}`,
    );
    expect(job).toEqual({ state: "queued", attempts: 0, claimed_by: null });
    expect(await samplesStored(up.runId)).toBe(0);

    app = await stack.app(faults.appPort);
    c = c.withBase(app.url);
    const run = await settledRun(c, up.runId, scale.timeoutMs);
    expect(run.status, run.error ?? "").toBe("ready");
    expect(run.sampleCount).toBe(rows);
    const after = await one<{ attempts: number }>(sql`SELECT attempts FROM ingest_jobs WHERE run_id = ${up.runId}`);
    expect(after.attempts).toBe(1);
  });
});

describe("MariaDB stopped", () => {
  it("gives pages a plain 503 page and the API a 503 answer, with no stack trace, and recovers", async () => {
    // Requests in flight when the database goes away end as a page or an error page, never a trace.
    const inFlight = Array.from({ length: 6 }, (_, i) => c.get(i % 2 ? `/runs/${readyRunId}` : "/dashboard"));
    await stack.stopService("mariadb");
    try {
      await whileDatabaseDown(inFlight);
    } finally {
      await stack.startService("mariadb");
    }
    await waitUntil("the debrief to render again", async () => (await c.get(`/runs/${readyRunId}`)).status === 200, 30_000, 250);
    expect((await runJson(c, readyRunId)).status).toBe("ready");
    expect(await samplesStored(readyRunId)).toBe(3_000);
  });
});

async function whileDatabaseDown(inFlight: Promise<Response>[]): Promise<void> {
  for (const res of await Promise.all(inFlight)) {
    expect([200, 500, 503]).toContain(res.status);
    expect(await res.text()).not.toMatch(STACK_TRACE);
  }
  // proxy.ts reuses its database probe's answer for 250 ms (lib/api/database-probe.ts).
  await new Promise((r) => setTimeout(r, 300));

  const page = await c.get(`/runs/${readyRunId}`);
  expect(page.status).toBe(503);
  expect(page.headers.get("retry-after")).toBeTruthy();
  const html = await page.text();
  expect(html).toContain("cannot reach its database");
  expect(html).not.toMatch(STACK_TRACE);

  const api = await c.get(`/api/runs/${readyRunId}`);
  expect(api.status).toBe(503);
  const apiBody = await api.text();
  expect(JSON.parse(apiBody).error.code).toBe("unavailable");
  expect(apiBody).not.toMatch(STACK_TRACE);
  expect((await c.get("/api/health")).status).toBe(503);
  await lookAt("/dashboard", "fault-database-down", "cannot reach its database");
}

describe("the object store stopped", () => {
  it("answers 503 where a file is needed, holds queued reads until it is back, and loses nothing", async () => {
    // An upload whose bytes reached the store before it went away.
    const body = await makeLog(2_000, 41);
    const created = await c.post("/api/uploads", { fileName: "store-outage.csv", size: Buffer.byteLength(body), contentType: "text/csv" });
    expect(created.status).toBe(201);
    const { uploadId, putUrl, contentType } = (await created.json()) as { uploadId: number; putUrl: string; contentType: string };
    expect((await fetch(putUrl, { method: "PUT", body, headers: { "content-type": contentType } })).status).toBe(200);

    await stack.stopService("s3");
    try {
      await whileStoreDown(uploadId);
    } finally {
      await stack.startService("s3");
    }
    const done = await c.post(`/api/uploads/${uploadId}/complete`, {});
    expect(done.status, await done.clone().text()).toBe(200);
    const stored = await settledRun(c, ((await done.json()) as { runId: number }).runId, 60_000);
    // The waiting re-parse runs at its next retry (the delays grow 2, 10, 30, 60 s).
    expect(stored.status).toBe("ready");
    expect(stored.sampleCount).toBe(2_000);
    const reparsed = await settledRun(c, readyRunId, 150_000);
    expect(reparsed.status).toBe("ready");
    expect(reparsed.sampleCount).toBe(3_000);
  });
});

async function whileStoreDown(uploadId: number): Promise<void> {
  const complete = await c.post(`/api/uploads/${uploadId}/complete`, {});
  expect(complete.status).toBe(503);
  const text = await complete.text();
  expect(JSON.parse(text).error.message).toMatch(/File storage is not answering/);
  expect(text).not.toMatch(STACK_TRACE);
  const health = (await (await c.get("/api/health")).json()) as { database: boolean; objectStore: boolean };
  expect(health).toMatchObject({ database: true, objectStore: false });

  // A re-parse asked for now waits in the queue, saying why, instead of failing the run.
  expect((await c.post(`/api/runs/${readyRunId}/reparse`, {})).status).toBe(200);
  const waiting = await waitUntil("the re-parse to wait for storage", async () => {
    const r = await runJson(c, readyRunId);
    return r.status === "queued" && r.error && /trying again/.test(r.error) ? r : null;
  }, 30_000, 200);
  expect(waiting.error).toMatch(/storage service stopped answering/);
  // What the crew sees on the run page meanwhile: the wait and its reason, not a failure.
  await lookAt(`/runs/${readyRunId}`, "fault-run-waiting-for-storage", /trying again shortly/);
}

describe("the mail server stopped", () => {
  it("still invites, keeps the mail in the outbox, retries, and delivers when SMTP is back", async () => {
    const invitee = uniqueEmail("outbox-invitee");
    await stack.stopService("mail");
    let downAt = 0;
    try {
      const res = await c.post(`/api/crews/${lead.crewId}/invitations`, { email: invitee, role: "observer" });
      expect(res.status, await res.clone().text()).toBe(201);
      const failedOnce = await waitUntil("a failed delivery attempt", async () => {
        const m = await one<{ state: string; attempts: number; last_error: string | null } | undefined>(
          sql`SELECT state, attempts, last_error FROM mail_outbox WHERE to_address = ${invitee}`,
        );
        return m && m.attempts >= 1 && m.last_error ? m : null;
      }, 20_000, 200);
      expect(failedOnce.state).toBe("pending");
      downAt = Date.now();
    } finally {
      await stack.startService("mail");
    }
    const mail = await waitForMail(invitee, /invit/i, 30_000);
    expect(mail.text ?? mail.html).toContain("/invite/");
    // The catcher has the mail a moment before the outbox row records it.
    const after = await waitUntil("the outbox to record the delivery", async () => {
      const m = await one<{ state: string; attempts: number; text_body: string; html_body: string }>(
        sql`SELECT state, attempts, text_body, html_body FROM mail_outbox WHERE to_address = ${invitee}`,
      );
      return m.state === "sent" ? m : null;
    }, 10_000);
    expect(after.attempts).toBeGreaterThanOrEqual(2);
    // The delivered invitation link is not kept in the database.
    expect(after.text_body + after.html_body).toBe("");
    report("mail-outage", { attempts: after.attempts, deliveredAfterRestartS: Number(((Date.now() - downAt) / 1000).toFixed(1)) });
  });
});
