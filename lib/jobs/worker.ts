import { isDatabaseDown } from "@/lib/api/database-down";
import { env } from "@/lib/env";
import { ingestRun, type IngestOutcome } from "@/lib/ingest/ingest-run";
import { drainOutbox, onMailQueued } from "@/lib/mail/outbox";
import { pruneRevokedSessions } from "@/lib/auth/sessions";
import { instanceId } from "./instance-id";
import {
  adoptOrphanRuns, claimIngestJob, finishIngestJob, heartbeatIngestJob, openIngestJobs, retryIngestJobLater, stillHoldsIngestJob, sweepStaleIngestJobs,
  type ClaimedJob,
} from "./ingest-jobs";

/**
 * The background worker: claims ingest jobs and sends queued mail. Every app instance runs one
 * (unless BACKGROUND_JOBS=off), and `npm run worker` runs one without serving pages. All state is
 * in MariaDB, so any number of them can share the work; a poll picks up jobs queued elsewhere.
 */
const POLL_MS = 1_000;
const SWEEP_EVERY_MS = 2_000;
/** Waits before a job that met a passing fault is tried again. */
const RETRY_DELAYS_S = [2, 10, 30];

interface WorkerState {
  owner: string;
  timer: NodeJS.Timeout | null;
  running: Map<number, Promise<void>>;
  ticking: boolean;
  again: boolean;
  lastSweep: number;
  lastComplaint: number;
  stopped: boolean;
}

const g = globalThis as unknown as { sortieWorker?: WorkerState };

export function workerRunning(): boolean {
  return Boolean(g.sortieWorker && !g.sortieWorker.stopped);
}

/** Starts this process's worker (idempotent). */
export function startWorker(): void {
  if (workerRunning()) return;
  const state: WorkerState = (g.sortieWorker = {
    owner: instanceId(),
    timer: null,
    running: new Map(),
    ticking: false,
    again: false,
    lastSweep: 0,
    lastComplaint: 0,
    stopped: false,
  });
  state.timer = setInterval(() => void tick(state), POLL_MS);
  // A worker inside a script must not keep the process alive once the script is done.
  state.timer.unref();
  onMailQueued(() => pokeWorker());
  adoptOrphanRuns()
    .then((n) => n && console.log(`[ingest] ${n} run(s) left mid-read without a job were queued again`))
    .catch(() => {})
    .finally(() => void tick(state));
}

/** Stops claiming new work and waits for jobs in hand to finish. */
export async function stopWorker(): Promise<void> {
  const state = g.sortieWorker;
  if (!state) return;
  state.stopped = true;
  if (state.timer) clearInterval(state.timer);
  await Promise.allSettled([...state.running.values()]);
  g.sortieWorker = undefined;
}

/** Work was queued in this process: look now rather than at the next poll. */
export function pokeWorker(): void {
  const state = g.sortieWorker;
  if (state && !state.stopped) setImmediate(() => void tick(state));
}

async function tick(state: WorkerState): Promise<void> {
  if (state.stopped) return;
  if (state.ticking) {
    state.again = true;
    return;
  }
  state.ticking = true;
  try {
    const e = env();
    if (Date.now() - state.lastSweep > SWEEP_EVERY_MS) {
      state.lastSweep = Date.now();
      const swept = await sweepStaleIngestJobs(e.INGEST_STALE_AFTER_S, e.INGEST_MAX_ATTEMPTS);
      if (Math.random() < 0.01) await pruneRevokedSessions();
      if (swept.requeued || swept.failed) {
        console.log(`[ingest] jobs whose reader stopped: ${swept.requeued} queued again, ${swept.failed} failed after ${e.INGEST_MAX_ATTEMPTS} attempts`);
      }
    }
    while (!state.stopped && state.running.size < e.INGEST_PARALLEL) {
      const job = await claimIngestJob(state.owner);
      if (!job) break;
      state.running.set(job.id, runJob(state, job));
    }
    await drainOutbox();
  } catch (err) {
    // A database outage: say so once a minute, keep polling, pick up where we were when it returns.
    if (Date.now() - state.lastComplaint > 60_000) {
      state.lastComplaint = Date.now();
      console.error(`[worker] ${isDatabaseDown(err) ? "database not answering" : "poll failed"}: ${(err as Error).message}`);
    }
  } finally {
    state.ticking = false;
    if (state.again) {
      state.again = false;
      pokeWorker();
    }
  }
}

async function runJob(state: WorkerState, job: ClaimedJob): Promise<void> {
  const { INGEST_STALE_AFTER_S, INGEST_MAX_ATTEMPTS } = env();
  const beat = setInterval(() => void heartbeatIngestJob(job.id, state.owner).catch(() => {}), Math.max(500, (INGEST_STALE_AFTER_S * 1000) / 4));
  let outcome: IngestOutcome;
  try {
    outcome = await ingestRun(job.runId, {
      mayRetry: job.attempt < INGEST_MAX_ATTEMPTS,
      stillHolds: (conn) => stillHoldsIngestJob(conn, job.runId, state.owner),
    });
  } catch (err) {
    outcome = { kind: "failed", error: (err as Error).message };
  } finally {
    clearInterval(beat);
  }
  try {
    if (outcome.kind === "retry") {
      const delay = RETRY_DELAYS_S[Math.min(job.attempt - 1, RETRY_DELAYS_S.length - 1)];
      await retryIngestJobLater(job.id, state.owner, delay, outcome.error);
    } else if (outcome.kind !== "lost") {
      await finishIngestJob(job.id, state.owner, outcome.kind === "ready" ? "done" : "failed", outcome.kind === "failed" ? outcome.error : undefined);
    }
  } catch (err) {
    // Unrecorded: the heartbeat has stopped, so a sweep settles this job later.
    console.error(`[ingest] could not record the end of job ${job.id}: ${(err as Error).message}`);
  } finally {
    state.running.delete(job.id);
    pokeWorker();
  }
}

/**
 * Runs a worker in this process until no ingest job is open (for the seed scripts, which
 * enqueue through the real pipeline and must finish before they exit).
 */
export async function drainIngestHere(timeoutMs = 10 * 60_000): Promise<void> {
  const mine = !workerRunning();
  startWorker();
  const t0 = Date.now();
  try {
    while ((await openIngestJobs()) > 0 || (g.sortieWorker?.running.size ?? 0) > 0) {
      if (Date.now() - t0 > timeoutMs) throw new Error("the ingest queue did not empty in time");
      pokeWorker();
      await new Promise((r) => setTimeout(r, 200));
    }
  } finally {
    if (mine) await stopWorker();
  }
}
