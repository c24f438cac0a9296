import { and, eq, inArray, sql } from "drizzle-orm";
import type { PoolConnection } from "mysql2/promise";
import { db, pool } from "@/db/client";
import { ingestJobs, runs } from "@/db/schema";

/**
 * The ingest queue's table operations (db/schema/jobs.ts). Every time comes from the database's
 * own clock, so instances with skewed clocks still agree on what is stale.
 */

export interface ClaimedJob {
  id: number;
  runId: number;
  /** This claim's number, from 1. */
  attempt: number;
}

const affected = (r: unknown) => (r as { affectedRows?: number }).affectedRows ?? 0;

/** Puts a run in the queue (again): one row per run, reset to a fresh first attempt. */
export async function enqueueIngestJob(runId: number): Promise<void> {
  await db()
    .insert(ingestJobs)
    .values({ runId, state: "queued", attempts: 0, availableAt: sql`NOW(3)` })
    .onDuplicateKeyUpdate({
      set: { state: "queued", attempts: 0, availableAt: sql`NOW(3)`, claimedBy: null, heartbeatAt: null, lastError: null },
    });
}

/** Takes the oldest due job no other instance holds; SKIP LOCKED lets instances claim side by side without waiting on each other. */
export async function claimIngestJob(owner: string): Promise<ClaimedJob | null> {
  const conn = await pool().getConnection();
  try {
    await conn.beginTransaction();
    const [rows] = await conn.query(
      "SELECT id, run_id, attempts FROM ingest_jobs WHERE state = 'queued' AND available_at <= NOW(3) ORDER BY available_at, id LIMIT 1 FOR UPDATE SKIP LOCKED",
    );
    const row = (rows as { id: number; run_id: number; attempts: number }[])[0];
    if (!row) {
      await conn.commit();
      return null;
    }
    await conn.query("UPDATE ingest_jobs SET state = 'running', claimed_by = ?, heartbeat_at = NOW(3), attempts = attempts + 1 WHERE id = ?", [owner, row.id]);
    await conn.commit();
    return { id: Number(row.id), runId: Number(row.run_id), attempt: row.attempts + 1 };
  } catch (e) {
    await conn.rollback().catch(() => {});
    throw e;
  } finally {
    conn.release();
  }
}

/** Keeps a claim alive; false when the claim was lost (queued again by a sweep, or re-queued by a re-parse). */
export async function heartbeatIngestJob(jobId: number, owner: string): Promise<boolean> {
  const [r] = await db()
    .update(ingestJobs)
    .set({ heartbeatAt: sql`NOW(3)` })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, owner)));
  return affected(r) > 0;
}

/**
 * Inside the ingest transaction, just before it commits: locks the job row and says whether this
 * instance still holds it, so a process that lost its claim never commits over the new holder.
 */
export async function stillHoldsIngestJob(conn: PoolConnection, runId: number, owner: string): Promise<boolean> {
  const [rows] = await conn.query("SELECT state, claimed_by FROM ingest_jobs WHERE run_id = ? FOR UPDATE", [runId]);
  const row = (rows as { state: string; claimed_by: string | null }[])[0];
  return row?.state === "running" && row.claimed_by === owner;
}

export async function finishIngestJob(jobId: number, owner: string, state: "done" | "failed", error?: string): Promise<void> {
  await db()
    .update(ingestJobs)
    // claimed_by stays: it tells an operator which process read the log.
    .set({ state, lastError: error ?? null })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, owner)));
}

/** A passing fault (storage or database not answering): back in the queue after `delayS`. */
export async function retryIngestJobLater(jobId: number, owner: string, delayS: number, error: string): Promise<void> {
  await db()
    .update(ingestJobs)
    .set({ state: "queued", claimedBy: null, heartbeatAt: null, lastError: error, availableAt: sql`NOW(3) + INTERVAL ${Math.round(delayS * 1e6)} MICROSECOND` })
    .where(and(eq(ingestJobs.id, jobId), eq(ingestJobs.state, "running"), eq(ingestJobs.claimedBy, owner)));
}

export const GAVE_UP = (n: number) =>
  `Reading this log stopped ${n} times before it finished (the server was restarted or ran out of memory); re-parse it to try again`;

/**
 * Jobs whose holder stopped sending heartbeats (its process died): queued again, or failed once
 * they have used their attempts. Safe to run from every instance at once; each UPDATE is atomic.
 * Returns how many jobs were touched.
 */
export async function sweepStaleIngestJobs(staleAfterS: number, maxAttempts: number): Promise<{ requeued: number; failed: number }> {
  // Give-ups first, so the re-queue below cannot pick them up.
  const [gaveUp] = await db().execute(sql`
    UPDATE ${runs} r JOIN ${ingestJobs} j ON j.run_id = r.id
    SET j.state = 'failed', j.claimed_by = NULL, j.last_error = 'stale', r.status = 'failed', r.progress = 0, r.sample_count = 0, r.error = ${GAVE_UP(maxAttempts)}
    WHERE j.state = 'running' AND j.heartbeat_at < NOW(3) - INTERVAL ${staleAfterS} SECOND AND j.attempts >= ${maxAttempts}`);
  const [requeued] = await db().execute(sql`
    UPDATE ${runs} r JOIN ${ingestJobs} j ON j.run_id = r.id
    SET j.state = 'queued', j.claimed_by = NULL, j.heartbeat_at = NULL, j.available_at = NOW(3), j.last_error = 'stale', r.status = 'queued', r.progress = 0
    WHERE j.state = 'running' AND j.heartbeat_at < NOW(3) - INTERVAL ${staleAfterS} SECOND AND j.attempts < ${maxAttempts}`);
  // A multi-table UPDATE counts rows of both tables.
  return { requeued: Math.ceil(affected(requeued) / 2), failed: Math.ceil(affected(gaveUp) / 2) };
}

/**
 * Runs left queued or mid-read with no job row (stored before the queue existed): given one, so
 * the queue picks them up. Run once at start.
 */
export async function adoptOrphanRuns(): Promise<number> {
  const [r] = await db().execute(sql`
    INSERT IGNORE INTO ${ingestJobs} (run_id, state, attempts, available_at)
    SELECT r.id, 'queued', 0, NOW(3) FROM ${runs} r LEFT JOIN ${ingestJobs} j ON j.run_id = r.id
    WHERE j.id IS NULL AND r.status IN ('queued', 'parsing', 'analysing')`);
  return affected(r);
}

/** Jobs waiting or being read (for scripts that wait for the queue to empty). */
export async function openIngestJobs(): Promise<number> {
  const [row] = await db()
    .select({ n: sql<number>`COUNT(*)` })
    .from(ingestJobs)
    .where(inArray(ingestJobs.state, ["queued", "running"]));
  return Number(row?.n ?? 0);
}

export async function ingestJobFor(runId: number) {
  const [row] = await db().select().from(ingestJobs).where(eq(ingestJobs.runId, runId)).limit(1);
  return row ?? null;
}
