import { randomBytes } from "node:crypto";
import { and, eq, inArray, sql, type SQL } from "drizzle-orm";
import type { PoolConnection } from "mysql2/promise";
import { db, inConnectionTransaction } from "@/db/client";
import { ingestJobs, runs } from "@/db/schema";

/**
 * The ingest queue's table operations (db/schema/jobs.ts). Every time comes from the database's
 * own clock, so instances with skewed clocks still agree on what is stale. A claim is named by a
 * token (instance id + a nonce per claim), so a process that lost a claim and claimed the job
 * again can never act on the newer claim with the older one.
 */

export interface ClaimedJob {
  id: number;
  runId: number;
  /** This claim's number, from 1 (passing-fault retries do not count). */
  attempt: number;
  retries: number;
  token: string;
}

const affected = (r: unknown) => (r as { affectedRows?: number }).affectedRows ?? 0;

/** Puts a run in the queue (again): one row per run, reset to a fresh first attempt. */
export async function enqueueIngestJob(runId: number): Promise<void> {
  await db()
    .insert(ingestJobs)
    .values({ runId, state: "queued", attempts: 0, retries: 0, availableAt: sql`NOW(3)` })
    .onDuplicateKeyUpdate({
      set: { state: "queued", attempts: 0, retries: 0, availableAt: sql`NOW(3)`, claimedBy: null, heartbeatAt: null, lastError: null },
    });
}

/** Takes the oldest due job no other instance holds; SKIP LOCKED lets instances claim side by side without waiting on each other. */
export async function claimIngestJob(owner: string): Promise<ClaimedJob | null> {
  return inConnectionTransaction(async (conn) => {
    const [rows] = await conn.query(
      "SELECT id, run_id, attempts, retries FROM ingest_jobs WHERE state = 'queued' AND available_at <= NOW(3) ORDER BY available_at, id LIMIT 1 FOR UPDATE SKIP LOCKED",
    );
    const row = (rows as { id: number; run_id: number; attempts: number; retries: number }[])[0];
    if (!row) return null;
    const token = `${owner}#${randomBytes(3).toString("hex")}`;
    await conn.query("UPDATE ingest_jobs SET state = 'running', claimed_by = ?, heartbeat_at = NOW(3), attempts = attempts + 1, updated_at = NOW(3) WHERE id = ?", [token, row.id]);
    return { id: Number(row.id), runId: Number(row.run_id), attempt: row.attempts + 1, retries: row.retries, token };
  });
}

/** SQL that is true while `token` still holds the run's job (for guarded writes to the run row). */
export function holdsClaim(runId: number, token: string): SQL {
  return sql`EXISTS (SELECT 1 FROM ${ingestJobs} WHERE ${ingestJobs.runId} = ${runId} AND ${ingestJobs.state} = 'running' AND ${ingestJobs.claimedBy} = ${token})`;
}

/** Keeps a claim alive; false when it was lost (queued again by a sweep, or by a re-parse). */
export async function heartbeatIngestJob(jobId: number, token: string): Promise<boolean> {
  const [r] = await db()
    .update(ingestJobs)
    .set({ heartbeatAt: sql`NOW(3)` })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, token)));
  return affected(r) > 0;
}

/** In a transaction: locks the run's job row and says whether `token` holds it. */
export async function holdsJobRow(conn: PoolConnection, runId: number, token: string): Promise<boolean> {
  const [rows] = await conn.query("SELECT state, claimed_by FROM ingest_jobs WHERE run_id = ? FOR UPDATE", [runId]);
  const row = (rows as { state: string; claimed_by: string | null }[])[0];
  return row?.state === "running" && row.claimed_by === token;
}

/**
 * Inside the ingest transaction, just before it commits: locks the job row and, if `token` still
 * holds it, marks it done in the same transaction. False when the claim was lost: the caller
 * rolls back, so a process that lost its claim never commits over the new holder, and a commit is
 * never followed by a job left "running".
 */
export async function settleIngestJobInTransaction(conn: PoolConnection, runId: number, token: string): Promise<boolean> {
  if (!(await holdsJobRow(conn, runId, token))) return false;
  await conn.query("UPDATE ingest_jobs SET state = 'done', last_error = NULL, updated_at = NOW(3) WHERE run_id = ?", [runId]);
  return true;
}

export async function failIngestJob(jobId: number, token: string, error: string): Promise<void> {
  await db()
    .update(ingestJobs)
    .set({ state: "failed", lastError: error })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, token)));
}

/**
 * The process is shutting down: its claims go straight back to the queue (another instance may
 * take them at once, without waiting for the heartbeat to go stale), and the interrupted read
 * does not count as an attempt. The readers' transactions die with the process and roll back.
 */
export async function releaseIngestClaims(tokens: string[]): Promise<number> {
  if (tokens.length === 0) return 0;
  const list = sql.join(tokens.map((t) => sql`${t}`), sql`, `);
  // The job's run and every other part of its upload (lib/parsers/run-splitter.ts) wait again.
  const [r] = await db().execute(sql`
    UPDATE ${ingestJobs} j JOIN ${runs} r ON r.id = j.run_id JOIN ${runs} p ON p.upload_id = r.upload_id
    SET j.state = 'queued', j.claimed_by = NULL, j.heartbeat_at = NULL, j.available_at = NOW(3), j.updated_at = NOW(3),
        j.attempts = GREATEST(j.attempts - 1, 0), j.last_error = 'shutdown', p.status = 'queued', p.progress = 0
    WHERE j.state = 'running' AND j.claimed_by IN (${list})`);
  return affected(r) > 0 ? tokens.length : 0;
}

/** A passing fault: back in the queue after `delayS`; the claim does not count as an attempt. */
export async function retryIngestJobLater(jobId: number, token: string, delayS: number, error: string): Promise<void> {
  await db()
    .update(ingestJobs)
    .set({
      state: "queued",
      claimedBy: null,
      heartbeatAt: null,
      lastError: error,
      attempts: sql`GREATEST(${ingestJobs.attempts} - 1, 0)`,
      retries: sql`${ingestJobs.retries} + 1`,
      availableAt: sql`NOW(3) + INTERVAL ${Math.round(delayS * 1e6)} MICROSECOND`,
    })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, token)));
}

export const GAVE_UP = (n: number) =>
  `Reading this log stopped ${n} times before it finished (the server was restarted or ran out of memory); re-parse it to try again`;

const inProgress = sql`('queued', 'parsing', 'analysing')`;

/**
 * Jobs whose holder stopped sending heartbeats (its process died): queued again, or failed once
 * they have used their attempts (a failed run keeps no samples). Claims in `liveTokens` (this
 * process's own readers, alive by definition) are left alone. Safe to run from every instance:
 * candidates are found with a plain read, then each is re-checked and changed under its own row
 * lock (SKIP LOCKED), so the sweep never holds locks on jobs it does not change.
 */
export async function sweepStaleIngestJobs(staleAfterS: number, maxAttempts: number, liveTokens: string[]): Promise<{ requeued: number; failed: number }> {
  const [found] = await db().execute(sql`
    SELECT run_id, claimed_by FROM ${ingestJobs}
    WHERE state = 'running' AND heartbeat_at < NOW(3) - INTERVAL ${staleAfterS} SECOND`);
  const candidates = (found as unknown as { run_id: number; claimed_by: string | null }[]).filter((c) => !c.claimed_by || !liveTokens.includes(c.claimed_by));
  let requeued = 0;
  let failed = 0;
  for (const { run_id: runId, claimed_by: token } of candidates) {
    const outcome = await inConnectionTransaction(async (conn) => {
      const [rows] = await conn.query(
        `SELECT attempts FROM ingest_jobs WHERE run_id = ? AND state = 'running' AND claimed_by <=> ? AND heartbeat_at < NOW(3) - INTERVAL ? SECOND
         FOR UPDATE SKIP LOCKED`,
        [runId, token, staleAfterS],
      );
      const job = (rows as { attempts: number }[])[0];
      if (!job) return null;
      // The job reads its upload for every part: they all wait again, or all fail.
      const parts = await uploadPartIds(conn, runId);
      if (job.attempts < maxAttempts) {
        await conn.query(
          "UPDATE ingest_jobs SET state = 'queued', claimed_by = NULL, heartbeat_at = NULL, available_at = NOW(3), last_error = 'stale', updated_at = NOW(3) WHERE run_id = ?",
          [runId],
        );
        await conn.query("UPDATE runs SET status = 'queued', progress = 0 WHERE id IN (?)", [parts]);
        return "requeued" as const;
      }
      await conn.query("UPDATE ingest_jobs SET state = 'failed', last_error = 'stale', updated_at = NOW(3) WHERE run_id = ?", [runId]);
      await conn.query("UPDATE runs SET status = 'failed', progress = 0, sample_count = 0, error = ? WHERE id IN (?)", [GAVE_UP(maxAttempts), parts]);
      // As after any failure: no samples, events or display levels of an earlier parse stay behind.
      await conn.query("DELETE FROM samples WHERE run_id IN (?)", [parts]);
      await conn.query("DELETE FROM events WHERE run_id IN (?)", [parts]);
      await conn.query("DELETE FROM series_levels WHERE run_id IN (?)", [parts]);
      return "failed" as const;
    });
    if (outcome === "requeued") requeued++;
    if (outcome === "failed") failed++;
  }
  return { requeued, failed };
}

/** Every run of the upload `runId` came from (itself included). */
async function uploadPartIds(conn: PoolConnection, runId: number): Promise<number[]> {
  const [rows] = await conn.query("SELECT p.id FROM runs r JOIN runs p ON p.upload_id = r.upload_id WHERE r.id = ?", [runId]);
  const ids = (rows as { id: number }[]).map((r) => Number(r.id));
  return ids.length ? ids : [runId];
}

/**
 * Runs that say they are being read while no job is open for them: a write that failed half-way
 * during an outage, or runs stored before the queue existed. A plain read; the worker revives the
 * ones it finds stuck on two passes in a row (reviveStuckRuns), so an enqueue in flight always wins.
 */
export async function stuckRunIds(): Promise<number[]> {
  // The job of a later part of a file is its part 1's (lib/ingest/ingest-run.ts): a stuck later
  // part names its part 1, which is what gets a job.
  const [rows] = await db().execute(sql`
    SELECT DISTINCT f.id FROM ${runs} r JOIN ${runs} f ON f.upload_id = r.upload_id AND f.part = 1
    LEFT JOIN ${ingestJobs} j ON j.run_id = f.id
    WHERE r.status IN ${inProgress} AND (j.id IS NULL OR j.state IN ('done', 'failed'))`);
  return (rows as unknown as { id: number }[]).map((r) => Number(r.id));
}

/** Gives each of these runs, if still stuck, a fresh job. Idempotent across instances. */
export async function reviveStuckRuns(runIds: number[]): Promise<number> {
  if (runIds.length === 0) return 0;
  const ids = sql.join(runIds.map((id) => sql`${id}`), sql`, `);
  // Still stuck: the run (a part 1) or any other part of its upload marked in progress.
  const stuck = sql`EXISTS (SELECT 1 FROM ${runs} p WHERE p.upload_id = r.upload_id AND p.status IN ${inProgress})`;
  const [adopted] = await db().execute(sql`
    INSERT IGNORE INTO ${ingestJobs} (run_id, state, attempts, retries, available_at)
    SELECT r.id, 'queued', 0, 0, NOW(3) FROM ${runs} r LEFT JOIN ${ingestJobs} j ON j.run_id = r.id
    WHERE r.id IN (${ids}) AND j.id IS NULL AND ${stuck}`);
  const [revived] = await db().execute(sql`
    UPDATE ${ingestJobs} j JOIN ${runs} r ON r.id = j.run_id
    SET j.state = 'queued', j.attempts = 0, j.retries = 0, j.claimed_by = NULL, j.heartbeat_at = NULL, j.available_at = NOW(3), j.updated_at = NOW(3)
    WHERE j.run_id IN (${ids}) AND j.state IN ('done', 'failed') AND ${stuck}`);
  return affected(adopted) + affected(revived);
}

/** Jobs waiting or being read (for scripts that wait for the queue to empty). */
export async function openIngestJobs(): Promise<number> {
  const [row] = await db()
    .select({ n: sql<number>`COUNT(*)` })
    .from(ingestJobs)
    .where(inArray(ingestJobs.state, ["queued", "running"]));
  return Number(row?.n ?? 0);
}
