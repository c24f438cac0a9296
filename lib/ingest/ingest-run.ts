import { and, eq } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import type { PoolConnection } from "mysql2/promise";
import { db, inConnectionTransaction, pool, schema } from "@/db/client";
import { getRunWithUpload } from "@/db/queries/runs";
import { events, runs, type RunWarning } from "@/db/schema";
import { alertAfterAnalysis } from "@/lib/alerts/run-alert";
import { errorCode, isDatabaseDown } from "@/lib/api/database-down";
import { holdsClaim, holdsJobRow, settleIngestJobInTransaction } from "@/lib/jobs/ingest-jobs";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import type { AnalysisEvent } from "@/lib/analysis/types";
import { columnMapSchema } from "@/lib/parsers/column-map";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseLog } from "@/lib/parsers/parse-log";
import { ParseError, type SampleBatch } from "@/lib/parsers/types";
import { ServiceUnavailableError } from "@/lib/errors";
import { seriesBlobs } from "@/lib/series/levels";
import { deleteSeriesLevels, writeSeriesLevels } from "@/lib/series/store";
import { readObject } from "@/lib/storage/objects";
import { countingSource, peek } from "./byte-source";
import { loadAnalysisInputs } from "./analysis-inputs";
import { startSampleLoad } from "./load-samples";

const PROGRESS_EVERY_MS = 400;

// MariaDB has no NaN or Infinity in DOUBLE columns.
const finiteOrNull = (v: number | null) => (v != null && Number.isFinite(v) ? v : null);

function eventRow(runId: number, e: AnalysisEvent) {
  return {
    runId,
    kind: e.kind,
    startS: e.startS,
    endS: Number.isFinite(e.endS) ? e.endS : e.startS,
    lat: finiteOrNull(e.lat),
    lon: finiteOrNull(e.lon),
    distanceFromHomeM: finiteOrNull(e.distanceFromHomeM),
    peak: finiteOrNull(e.peak),
    threshold: finiteOrNull(e.threshold),
    detail: e.detail ?? null,
  };
}

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

/**
 * Streams one run's original object through its parser into the samples table in a single
 * transaction; a failure part-way rolls back, so a run never has partial samples.
 */
export async function ingestRun(runId: number, opts: IngestOptions = {}, attempt = 1): Promise<IngestOutcome> {
  // Writes to the run row outside the transaction only land while this read holds the claim.
  const thisRun = opts.token ? and(eq(runs.id, runId), holdsClaim(runId, opts.token))! : eq(runs.id, runId);
  const stillHeld = async () => !opts.token || (await db().select({ id: runs.id }).from(runs).where(thisRun).limit(1)).length > 0;
  let row: Awaited<ReturnType<typeof getRunWithUpload>>;
  try {
    row = await getRunWithUpload(runId);
  } catch (e) {
    // The database went away between the claim and here: the job waits, the run is untouched.
    if (isPassingFault(e) && opts.mayRetry !== false) return { kind: "retry", error: describeFailure(e) };
    return { kind: "failed", error: describeFailure(e) };
  }
  if (!row) return { kind: "failed", error: "run not found" };
  if (!(await stillHeld().catch(() => true))) return { kind: "lost" };
  const { run, upload } = row;

  let bytes = 0;
  let lastT = NaN;
  let reported = 0;
  let progressWrite: Promise<unknown> = Promise.resolve();
  const reportProgress = (force = false) => {
    const now = Date.now();
    if (!force && now - reported < PROGRESS_EVERY_MS) return;
    reported = now;
    const progress = Math.min(0.99, upload.sizeBytes ? bytes / upload.sizeBytes : 0);
    progressWrite = progressWrite.then(() => db().update(runs).set({ progress }).where(thisRun)).catch(() => {});
  };

  let conn: PoolConnection | null = null;
  let load: ReturnType<typeof startSampleLoad> | null = null;
  try {
    await db().update(runs).set({ status: "parsing", progress: 0, error: null }).where(thisRun);
    conn = await pool().getConnection();
    const body = await readObject(upload.objectKey);
    const { head, source } = await peek(countingSource(body, (n) => ((bytes += n), reportProgress())));
    const format = detectFormat(head, upload.fileName);
    // Known before parsing, so a CSV that fails still offers its column map for correction.
    await db().update(runs).set({ format }).where(thisRun);
    const columnMap = format === "csv" && run.columnMap ? columnMapSchema.parse(run.columnMap) : undefined;

    const inputs = await loadAnalysisInputs(run);
    const collector = new SeriesCollector();
    // READ COMMITTED: the deletes below then take no gap locks, so two runs loading side by side
    // cannot deadlock on the neighbouring key ranges of the samples table.
    // SET TRANSACTION (not SESSION): only this transaction; the pooled connection goes back as it came.
    await conn.query("SET TRANSACTION ISOLATION LEVEL READ COMMITTED");
    await conn.beginTransaction();
    await conn.query("DELETE FROM samples WHERE run_id = ?", [runId]);
    await conn.query("DELETE FROM events WHERE run_id = ?", [runId]);
    await deleteSeriesLevels(conn, runId);
    load = startSampleLoad(conn, runId);
    const sink = load;
    const summary = await parseLog(format, source, {
      columnMap,
      onBatch: async (b: SampleBatch) => {
        if (opts.signal?.aborted) throw new LostClaim();
        // The latest time, not the last row's: a clock that steps back must not shorten the run.
        for (let i = 0; i < b.length; i++) if (b.columns.tS[i] > lastT || lastT !== lastT) lastT = b.columns.tS[i];
        // From the first batch's share of the bytes, size the series for the whole file once.
        if (collector.length === 0 && b.length && bytes > 0) collector.reserve((b.length * upload.sizeBytes * 1.1) / bytes, b.rc !== null);
        collector.add(b);
        await sink.write(b);
      },
    });
    const stored = await load.finish();
    load = null;
    if (stored !== summary.sampleCount) throw new Error(`stored ${stored} samples, parsed ${summary.sampleCount}`);
    if (summary.sampleCount === 0) throw new ParseError("The log contains no samples that could be read");

    await progressWrite;
    const warnings: RunWarning[] = summary.warnings.map((w) => ({ ...w }));
    await db().update(runs).set({ status: "analysing" }).where(thisRun);
    const series = collector.series(summary.modeNames);
    const analysis = analyseRun(series, inputs);
    const tx = drizzle(conn as never, { schema, mode: "default", casing: "snake_case" });
    for (let i = 0; i < analysis.events.length; i += 500) {
      await tx.insert(events).values(analysis.events.slice(i, i + 500).map((e) => eventRow(runId, e)));
    }
    // Display levels for the charts and the map, from the same arrays (lib/series/levels.ts).
    await writeSeriesLevels(conn, runId, seriesBlobs(series, analysis.perSample));
    // Samples, events, levels and the run's new state commit together.
    await tx
      .update(runs)
      .set({
        status: "ready",
        progress: 1,
        format,
        // New figures: a sign-off given to the earlier analysis does not carry over.
        signedOffBy: null,
        signedOffAt: null,
        sampleCount: summary.sampleCount,
        startedAt: summary.startedAt,
        durationS: Number.isFinite(lastT) ? lastT : null,
        distanceM: analysis.summary.distanceM,
        verdict: analysis.summary.verdict.level,
        warnings,
        modeNames: summary.modeNames,
        columnMap: (summary.columnMap as Record<string, unknown> | undefined) ?? null,
        summary: { ...analysis.summary, fieldsPresent: summary.fieldsPresent, hasRc: summary.hasRc, unplaced: summary.unplaced ?? [] },
        error: null,
      })
      .where(eq(runs.id, runId));
    // The alert decision and its mail commit with the figures: exactly once per analysis.
    await alertAfterAnalysis(runId, run.verdict ?? null, tx);
    if (opts.token && !(await settleIngestJobInTransaction(conn, runId, opts.token))) throw new LostClaim();
    await conn.commit();
    return { kind: "ready" };
  } catch (e) {
    await load?.abort();
    await conn?.rollback().catch(() => {});
    await progressWrite;
    if (e instanceof LostClaim || !(await stillHeld().catch(() => true))) return { kind: "lost" };
    if (errorCode(e) === "ER_LOCK_DEADLOCK" && attempt < 3) {
      conn?.release();
      conn = null;
      return ingestRun(runId, opts, attempt + 1);
    }
    if (opts.mayRetry && isPassingFault(e)) {
      console.error(`[ingest] run ${runId}: passing fault, will retry: ${(e as Error)?.message}`);
      const error = "A storage service stopped answering while the log was read; trying again shortly";
      await db().update(runs).set({ status: "queued", progress: 0, error }).where(thisRun).catch(() => {});
      return { kind: "retry", error };
    }
    const error = describeFailure(e);
    // A failed run has no samples, also when a re-parse fails after an earlier good parse. One
    // transaction that first locks the job: if another reader holds it now, its work is left alone.
    const settled = await inConnectionTransaction(async (c) => {
      if (opts.token && !(await holdsJobRow(c, runId, opts.token))) return false;
      await c.query("DELETE FROM samples WHERE run_id = ?", [runId]);
      await c.query("DELETE FROM events WHERE run_id = ?", [runId]);
      await deleteSeriesLevels(c, runId);
      await c.query("UPDATE runs SET status = 'failed', progress = 0, error = ?, sample_count = 0 WHERE id = ?", [error, runId]);
      return true;
    }).catch(() => true);
    return settled ? { kind: "failed", error } : { kind: "lost" };
  } finally {
    conn?.release();
  }
}
