import { isDatabaseDown } from "@/lib/api/database-down";
import { pruneRevokedSessions } from "@/lib/auth/sessions";
import { env } from "@/lib/env";
import { ingestRun, type IngestOutcome } from "@/lib/ingest/ingest-run";
import { drainOutbox, onMailQueued } from "@/lib/mail/outbox";
import { instanceId } from "./instance-id";
import {
  claimIngestJob, failIngestJob, heartbeatIngestJob, openIngestJobs, releaseIngestClaims, retryIngestJobLater, reviveStuckRuns, stuckRunIds, sweepStaleIngestJobs,
  type ClaimedJob,
} from "./ingest-jobs";

/**
 * The background worker: claims ingest jobs and sends queued mail. Every app instance runs one
 * (unless BACKGROUND_JOBS=off), and `npm run worker` runs one without serving pages. All state is
 * in MariaDB, so any number of them can share the work; a poll picks up jobs queued elsewhere.
 * Ingest and mail run in separate loops, so a stalled mail server never holds up a log.
 */
const POLL_MS = 1_000;
const SWEEP_EVERY_MS = 2_000;
const RECONCILE_EVERY_MS = 15_000;
/** Waits before a job that met a passing fault is tried again; the last one repeats. */
const RETRY_DELAYS_S = [2, 10, 30, 60];
/** About 20 minutes of outage before a run waiting on storage is failed with a re-parse hint. */
const MAX_RETRIES = 22;

interface WorkerState {
  owner: string;
  timer: NodeJS.Timeout | null;
  /** Readers in hand, by claim token. */
  running: Map<string, Promise<void>>;
  tick: Promise<void> | null;
  again: boolean;
  mail: Promise<void> | null;
  mailAgain: boolean;
  lastSweep: number;
  lastReconcile: number;
  /** Runs found stuck by the last reconcile pass. */
  stuck: Set<number>;
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
    tick: null,
    again: false,
    mail: null,
    mailAgain: false,
    lastSweep: 0,
    lastReconcile: 0,
    stuck: new Set(),
    lastComplaint: 0,
    stopped: false,
  });
  state.timer = setInterval(() => {
    pokeWorker();
    pokeMail();
  }, POLL_MS);
  // A worker inside a script must not keep the process alive once the script is done.
  state.timer.unref();
  onMailQueued(() => pokeMail());
  pokeWorker();
}

/** Stops claiming new work and waits for the work in hand (logs being read, mail being sent). */
export async function stopWorker(): Promise<void> {
  const state = g.sortieWorker;
  if (!state) return;
  state.stopped = true;
  if (state.timer) clearInterval(state.timer);
  await state.tick?.catch(() => {});
  await state.mail?.catch(() => {});
  await Promise.allSettled([...state.running.values()]);
  // A worker started while this one was stopping is not this one's to clear.
  if (g.sortieWorker === state) g.sortieWorker = undefined;
}

/**
 * On SIGTERM / SIGINT: stop claiming and hand the logs in hand back to the queue at once, in one
 * statement (the server exits right after its own shutdown, so there is no time to finish them).
 */
export async function handBackForShutdown(): Promise<void> {
  const state = g.sortieWorker;
  if (!state) return;
  state.stopped = true;
  if (state.timer) clearInterval(state.timer);
  const n = await releaseIngestClaims([...state.running.keys()]).catch(() => 0);
  if (n) console.log(`[ingest] shutting down: ${n} log(s) being read handed back to the queue`);
}

/** Work was queued in this process: look now rather than at the next poll. */
export function pokeWorker(): void {
  const state = g.sortieWorker;
  if (!state || state.stopped) return;
  if (state.tick) {
    state.again = true;
    return;
  }
  state.tick = tick(state).finally(() => {
    state.tick = null;
    if (state.again) {
      state.again = false;
      pokeWorker();
    }
  });
}

function pokeMail(): void {
  const state = g.sortieWorker;
  if (!state || state.stopped) return;
  if (state.mail) {
    state.mailAgain = true;
    return;
  }
  state.mail = drainOutbox(() => state.stopped)
    .then(() => undefined)
    .catch((err) => complain(state, "mail", err))
    .finally(() => {
      state.mail = null;
      if (state.mailAgain) {
        state.mailAgain = false;
        pokeMail();
      }
    });
}

/** A database outage: say so once a minute, keep polling, pick up where we were when it returns. */
function complain(state: WorkerState, what: string, err: unknown): void {
  if (Date.now() - state.lastComplaint < 60_000) return;
  state.lastComplaint = Date.now();
  console.error(`[worker] ${what}: ${isDatabaseDown(err) ? "database not answering" : "poll failed"}: ${(err as Error).message}`);
}

async function tick(state: WorkerState): Promise<void> {
  try {
    const e = env();
    const now = Date.now();
    if (now - state.lastSweep > SWEEP_EVERY_MS) {
      state.lastSweep = now;
      const swept = await sweepStaleIngestJobs(e.INGEST_STALE_AFTER_S, e.INGEST_MAX_ATTEMPTS, [...state.running.keys()]);
      if (swept.requeued || swept.failed) {
        console.log(`[ingest] jobs whose reader stopped: ${swept.requeued} queued again, ${swept.failed} failed after ${e.INGEST_MAX_ATTEMPTS} attempts`);
      }
    }
    if (now - state.lastReconcile > RECONCILE_EVERY_MS) {
      state.lastReconcile = now;
      // Stuck on two passes in a row (15 s apart), so an upload or re-parse mid-enqueue is never touched.
      const stuck = await stuckRunIds();
      const n = await reviveStuckRuns(stuck.filter((id) => state.stuck.has(id)));
      state.stuck = new Set(stuck);
      if (n) console.log(`[ingest] ${n} run(s) marked in progress without an open job were queued again`);
      await pruneRevokedSessions();
    }
    while (!state.stopped && state.running.size < e.INGEST_PARALLEL) {
      const job = await claimIngestJob(state.owner);
      if (!job) break;
      state.running.set(job.token, runJob(state, job));
    }
  } catch (err) {
    complain(state, "ingest", err);
  }
}

async function runJob(state: WorkerState, job: ClaimedJob): Promise<void> {
  const { INGEST_STALE_AFTER_S } = env();
  const lost = new AbortController();
  const beat = setInterval(() => {
    heartbeatIngestJob(job.id, job.token)
      .then((held) => held || lost.abort())
      .catch(() => {});
  }, Math.max(500, (INGEST_STALE_AFTER_S * 1000) / 4));
  let outcome: IngestOutcome;
  try {
    outcome = await ingestRun(job.runId, { token: job.token, mayRetry: job.retries < MAX_RETRIES, signal: lost.signal });
  } catch (err) {
    outcome = { kind: "failed", error: (err as Error).message };
  } finally {
    clearInterval(beat);
  }
  try {
    // "ready" settled the job inside its own commit; "lost" belongs to another claim now.
    if (outcome.kind === "retry") {
      await retryIngestJobLater(job.id, job.token, RETRY_DELAYS_S[Math.min(job.retries, RETRY_DELAYS_S.length - 1)], outcome.error);
    } else if (outcome.kind === "failed") {
      await failIngestJob(job.id, job.token, outcome.error);
    }
  } catch (err) {
    // Unrecorded: the heartbeat has stopped, so a sweep settles this job later.
    console.error(`[ingest] could not record the end of job ${job.id}: ${(err as Error).message}`);
  } finally {
    state.running.delete(job.token);
    pokeWorker();
    // An alert queued with the analysis goes out now rather than at the next poll.
    if (outcome.kind === "ready") pokeMail();
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
