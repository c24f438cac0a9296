import { and, asc, eq, inArray } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import type { PoolConnection } from "mysql2/promise";
import { db, inConnectionTransaction, pool, schema } from "@/db/client";
import { getRunWithUpload } from "@/db/queries/runs";
import { runs, type Run, type RunWarning } from "@/db/schema";
import { errorCode, isDatabaseDown } from "@/lib/api/database-down";
import { holdsClaim, holdsJobRow, settleIngestJobInTransaction } from "@/lib/jobs/ingest-jobs";
import { columnMapSchema } from "@/lib/parsers/column-map";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseLog } from "@/lib/parsers/parse-log";
import { RunSplitter } from "@/lib/parsers/run-splitter";
import { ParseError } from "@/lib/parsers/types";
import { ServiceUnavailableError } from "@/lib/errors";
import { deleteSeriesLevels } from "@/lib/series/store";
import { readObject } from "@/lib/storage/objects";
import { countingSource, peek } from "./byte-source";
import { loadAnalysisInputs } from "./analysis-inputs";
import { PartLoader } from "./part-loader";
import { storePart } from "./store-part";
import { TsvEncoder } from "./tsv-worker";

const PROGRESS_EVERY_MS = 400;

/** What a person reads when a log cannot be stored; internals stay in the server log. */
export function describeFailure(e: unknown): string {
  if (e instanceof ParseError) return e.describe();
  console.error("[ingest] unexpected failure", e);
  if (isPassingFault(e)) return "A storage service stopped answering while the log was read; re-parse it to try again";
  return "The log could not be processed because of an error on our side; re-parse it to try again";
}

export type IngestOutcome =
  | { kind: "ready" }
  | { kind: "failed"; error: string }
  /** A passing fault (storage or database not answering): the run waits, queued, for another attempt. */
  | { kind: "retry"; error: string }
  /** This process no longer holds the job (another instance took it over): nothing was committed. */
  | { kind: "lost" };

export interface IngestOptions {
  /**
   * The queue claim this read runs under (lib/jobs/ingest-jobs.ts). With it, every write to the
   * run row is guarded by still holding the claim, and the job is settled inside the commit.
   * Without it (benchmarks), the run is read unguarded.
   */
  token?: string;
  /** False when the job may not wait any longer: a passing fault then fails the run. */
  mayRetry?: boolean;
  /** Aborted when the worker learns the claim is lost; the read stops at the next batch. */
  signal?: AbortSignal;
}

class LostClaim extends Error {}


/** Connection-level failures of S3 or MariaDB, worth another attempt later. */
function isPassingFault(e: unknown): boolean {
  if (e instanceof ParseError) return false;
  if (e instanceof ServiceUnavailableError || isDatabaseDown(e)) return true;
  const msg = `${(e as Error)?.name ?? ""} ${(e as Error)?.message ?? ""} ${errorCode(e) ?? ""}`;
  return /ECONNREFUSED|ECONNRESET|ETIMEDOUT|EPIPE|ER_LOCK_WAIT_TIMEOUT|socket hang up|TimeoutError|ServiceUnavailable|SlowDown|InternalError/.test(msg);
}

/** Deletes the samples, events and display levels of these runs (no foreign key on samples). */
async function clearRunData(conn: PoolConnection, ids: number[]): Promise<void> {
  if (ids.length === 0) return;
  await conn.query("DELETE FROM samples WHERE run_id IN (?)", [ids]);
  await conn.query("DELETE FROM events WHERE run_id IN (?)", [ids]);
  for (const id of ids) await deleteSeriesLevels(conn, id);
}

/**
 * Streams one upload's original object through its parser into the samples table in a single
 * transaction; a failure part-way rolls back, so a run never has partial samples. `runId` is the
 * run the queue job belongs to (part 1 of its upload). A file holding several separate runs is cut
 * into parts while it streams (lib/parsers/run-splitter.ts, thresholds.runSplitGapS): each part is
 * loaded into its own run — the upload's existing run with that part number, else a new one — and
 * analysed, all in the same transaction; runs of parts the file no longer has are removed.
 */
export async function ingestRun(runId: number, opts: IngestOptions = {}, attempt = 1): Promise<IngestOutcome> {
  // Writes to the run row outside the transaction only land while this read holds the claim.
  const thisRun = opts.token ? and(eq(runs.id, runId), holdsClaim(runId, opts.token))! : eq(runs.id, runId);
  const stillHeld = async () => !opts.token || (await db().select({ id: runs.id }).from(runs).where(thisRun).limit(1)).length > 0;
  let row: Awaited<ReturnType<typeof getRunWithUpload>>;
  let existing: Run[];
  try {
    row = await getRunWithUpload(runId);
    existing = row ? await db().select().from(runs).where(eq(runs.uploadId, row.upload.id)).orderBy(asc(runs.part)) : [];
  } catch (e) {
    // The database went away between the claim and here: the job waits, the run is untouched.
    if (isPassingFault(e) && opts.mayRetry !== false) return { kind: "retry", error: describeFailure(e) };
    return { kind: "failed", error: describeFailure(e) };
  }
  if (!row) return { kind: "failed", error: "run not found" };
  if (!(await stillHeld().catch(() => true))) return { kind: "lost" };
  const { run, upload } = row;
  const existingIds = existing.map((r) => r.id);
  // Every run of the upload shows the read's state; guarded by this read's claim like the run's own row.
  const theseRuns = opts.token ? and(inArray(runs.id, existingIds), holdsClaim(runId, opts.token))! : inArray(runs.id, existingIds);

  let bytes = 0;
  let reported = 0;
  let progressWrite: Promise<unknown> = Promise.resolve();
  const reportProgress = (force = false) => {
    const now = Date.now();
    if (!force && now - reported < PROGRESS_EVERY_MS) return;
    reported = now;
    const progress = Math.min(0.99, upload.sizeBytes ? bytes / upload.sizeBytes : 0);
    progressWrite = progressWrite.then(() => db().update(runs).set({ progress }).where(theseRuns)).catch(() => {});
  };

  let conn: PoolConnection | null = null;
  let loader: PartLoader | null = null;
  const encoder = new TsvEncoder(runId);
  try {
    await db().update(runs).set({ status: "parsing", progress: 0, error: null }).where(theseRuns);
    conn = await pool().getConnection();
    const body = await readObject(upload.objectKey);
    const { head, source } = await peek(countingSource(body, (n) => ((bytes += n), reportProgress())));
    const format = detectFormat(head, upload.fileName);
    // Known before parsing, so a CSV that fails still offers its column map for correction.
    await db().update(runs).set({ format }).where(theseRuns);
    const columnMap = format === "csv" && run.columnMap ? columnMapSchema.parse(run.columnMap) : undefined;

    const inputs = await loadAnalysisInputs(run);
    const tx = drizzle(conn as never, { schema, mode: "default", casing: "snake_case" });
    // READ COMMITTED: the deletes below then take no gap locks, so two runs loading side by side
    // cannot deadlock on the neighbouring key ranges of the samples table.
    // SET TRANSACTION (not SESSION): only this transaction; the pooled connection goes back as it came.
    await conn.query("SET TRANSACTION ISOLATION LEVEL READ COMMITTED");
    await conn.beginTransaction();
    await clearRunData(conn, existingIds);
    const first = existing.find((r) => r.part === 1) ?? run;
    loader = new PartLoader(conn, tx, existing, first, encoder, () => bytes, upload.sizeBytes, () => {
      if (opts.signal?.aborted) throw new LostClaim();
    });
    // Parts are cut as the batches stream: no second pass over the file.
    const splitter = new RunSplitter(loader, { gapS: inputs.thresholds.runSplitGapS });
    const parsed = await parseLog(format, source, { columnMap, onBatch: (b) => splitter.push(b) });
    const parts = await splitter.finish();
    const stored = parts.reduce((n, p) => n + p.sampleCount, 0);
    if (stored !== parsed.sampleCount) throw new Error(`stored ${stored} samples, parsed ${parsed.sampleCount}`);
    if (parsed.sampleCount === 0) throw new ParseError("The log contains no samples that could be read");

    await progressWrite;
    const warnings: RunWarning[] = parsed.warnings.map((w) => ({ ...w }));
    await db().update(runs).set({ status: "analysing" }).where(theseRuns);
    for (const p of loader.loaded) {
      // Each part with its own build and route plan (a part can be moved to another build).
      const partInputs = p.previous && p.previous.id !== run.id ? await loadAnalysisInputs(p.previous) : inputs;
      await storePart({ conn, tx, format, parsed, warnings, partCount: parts.length, inputs: partInputs }, p);
    }
    // Parts this read of the file no longer has (a re-parse with another map or threshold).
    const gone = existing.filter((r) => r.part > parts.length && r.id !== runId).map((r) => r.id);
    if (gone.length) {
      await clearRunData(conn, gone);
      await tx.delete(runs).where(inArray(runs.id, gone));
    }
    // Samples, events, levels and every part's new state commit together.
    if (opts.token && !(await settleIngestJobInTransaction(conn, runId, opts.token))) throw new LostClaim();
    await conn.commit();
    return { kind: "ready" };
  } catch (e) {
    await loader?.abort();
    await conn?.rollback().catch(() => {});
    await progressWrite;
    if (e instanceof LostClaim || !(await stillHeld().catch(() => true))) return { kind: "lost" };
    if (errorCode(e) === "ER_LOCK_DEADLOCK" && attempt < 3) {
      conn?.release();
      conn = null;
      await encoder.close();
      return ingestRun(runId, opts, attempt + 1);
    }
    if (opts.mayRetry && isPassingFault(e)) {
      console.error(`[ingest] run ${runId}: passing fault, will retry: ${(e as Error)?.message}`);
      const error = "A storage service stopped answering while the log was read; trying again shortly";
      await db().update(runs).set({ status: "queued", progress: 0, error }).where(theseRuns).catch(() => {});
      return { kind: "retry", error };
    }
    const error = describeFailure(e);
    // A failed run has no samples, also when a re-parse fails after an earlier good parse; every
    // part of the upload fails with it (they are one file). One transaction that first locks the
    // job: if another reader holds it now, its work is left alone.
    const settled = await inConnectionTransaction(async (c) => {
      if (opts.token && !(await holdsJobRow(c, runId, opts.token))) return false;
      await clearRunData(c, existingIds);
      await c.query("UPDATE runs SET status = 'failed', progress = 0, error = ?, sample_count = 0 WHERE id IN (?)", [error, existingIds]);
      return true;
    }).catch(() => true);
    return settled ? { kind: "failed", error } : { kind: "lost" };
  } finally {
    await encoder.close();
    conn?.release();
  }
}
