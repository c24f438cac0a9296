import { index, mysqlEnum, mysqlTable, smallint, text, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { ms, id, lifecycleDates, ref } from "./util/columns";
import { runs } from "./runs";

export const jobStates = ["queued", "running", "done", "failed"] as const;
export type JobState = (typeof jobStates)[number];

/**
 * The durable ingest queue. Any app instance (or `npm run worker`) claims a queued row with
 * SELECT … FOR UPDATE SKIP LOCKED, keeps `heartbeat_at` fresh while it reads the log, and a row
 * whose heartbeat has gone stale (its process died) is queued again by whoever notices first.
 * One row per run: a re-parse puts the same row back in the queue.
 */
export const ingestJobs = mysqlTable(
  "ingest_jobs",
  {
    id: id(),
    runId: ref().notNull().references(() => runs.id, { onDelete: "cascade" }),
    state: mysqlEnum(jobStates).notNull().default("queued"),
    /** Claims since the job was last queued; a log that kills its reader every time stops at the limit. */
    attempts: smallint({ unsigned: true }).notNull().default(0),
    /** Waits for a passing fault (storage or database not answering); counted apart from attempts. */
    retries: smallint({ unsigned: true }).notNull().default(0),
    /** Not before this time (retry back-off). */
    availableAt: ms().notNull(),
    /** The current claim: the holder's instance id plus a nonce per claim (lib/jobs/ingest-jobs.ts). */
    claimedBy: varchar({ length: 100 }),
    heartbeatAt: ms(),
    lastError: text(),
    ...lifecycleDates(),
  },
  (t) => [uniqueIndex("ingest_jobs_run_uq").on(t.runId), index("ingest_jobs_state_available_idx").on(t.state, t.availableAt)],
);

export type IngestJob = typeof ingestJobs.$inferSelect;
