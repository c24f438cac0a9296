import { eq } from "drizzle-orm";
import { drizzle } from "drizzle-orm/mysql2";
import type { PoolConnection } from "mysql2/promise";
import { db, pool, schema } from "@/db/client";
import { getRunWithUpload } from "@/db/queries/runs";
import { runs, type RunWarning } from "@/db/schema";
import { columnMapSchema } from "@/lib/parsers/column-map";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseLog } from "@/lib/parsers/parse-log";
import { ParseError, type SampleBatch } from "@/lib/parsers/types";
import { readObject } from "@/lib/storage/objects";
import { countingSource, peek } from "./byte-source";
import { startSampleLoad } from "./load-samples";

const PROGRESS_EVERY_MS = 400;

/** What a person reads when a log cannot be stored; internals stay in the server log. */
export function describeFailure(e: unknown): string {
  if (e instanceof ParseError) return e.describe();
  const msg = (e as Error)?.message ?? String(e);
  console.error("[ingest] unexpected failure", e);
  if (/ECONNREFUSED|ETIMEDOUT|PROTOCOL_CONNECTION_LOST/.test(msg)) return "A storage service stopped answering while the log was read; re-parse it to try again";
  return "The log could not be processed because of an error on our side; re-parse it to try again";
}

/**
 * Streams one run's original object through its parser into the samples table in a single
 * transaction; a failure part-way rolls back, so a run never has partial samples.
 */
export async function ingestRun(runId: number): Promise<void> {
  const row = await getRunWithUpload(runId);
  if (!row) return;
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
    progressWrite = progressWrite.then(() => db().update(runs).set({ progress }).where(eq(runs.id, runId))).catch(() => {});
  };

  let conn: PoolConnection | null = null;
  let load: ReturnType<typeof startSampleLoad> | null = null;
  try {
    await db().update(runs).set({ status: "parsing", progress: 0, error: null }).where(eq(runs.id, runId));
    conn = await pool().getConnection();
    const body = await readObject(upload.objectKey);
    const { head, source } = await peek(countingSource(body, (n) => ((bytes += n), reportProgress())));
    const format = detectFormat(head, upload.fileName);
    // Known before parsing, so a CSV that fails still offers its column map for correction.
    await db().update(runs).set({ format }).where(eq(runs.id, runId));
    const columnMap = format === "csv" && run.columnMap ? columnMapSchema.parse(run.columnMap) : undefined;

    await conn.beginTransaction();
    await conn.query("DELETE FROM samples WHERE run_id = ?", [runId]);
    load = startSampleLoad(conn, runId);
    const sink = load;
    const summary = await parseLog(format, source, {
      columnMap,
      onBatch: async (b: SampleBatch) => {
        if (b.length) lastT = b.columns.tS[b.length - 1];
        await sink.write(b);
      },
    });
    const stored = await load.finish();
    load = null;
    if (stored !== summary.sampleCount) throw new Error(`stored ${stored} samples, parsed ${summary.sampleCount}`);
    if (summary.sampleCount === 0) throw new ParseError("The log contains no samples that could be read");

    await progressWrite;
    const warnings: RunWarning[] = summary.warnings.map((w) => ({ ...w }));
    // Samples and the run's new state commit together.
    await drizzle(conn as never, { schema, mode: "default", casing: "snake_case" })
      .update(runs)
      .set({
        status: "ready",
        progress: 1,
        format,
        sampleCount: summary.sampleCount,
        startedAt: summary.startedAt,
        durationS: Number.isFinite(lastT) ? lastT : null,
        warnings,
        modeNames: summary.modeNames,
        columnMap: (summary.columnMap as Record<string, unknown> | undefined) ?? null,
        summary: { fieldsPresent: summary.fieldsPresent, hasRc: summary.hasRc, unplaced: summary.unplaced ?? [] },
        error: null,
      })
      .where(eq(runs.id, runId));
    await conn.commit();
  } catch (e) {
    await load?.abort();
    await conn?.rollback().catch(() => {});
    await progressWrite;
    // A failed run has no samples, also when a re-parse fails after an earlier good parse.
    await conn?.query("DELETE FROM samples WHERE run_id = ?", [runId]).catch(() => {});
    await db()
      .update(runs)
      .set({ status: "failed", progress: 0, error: describeFailure(e), sampleCount: 0 })
      .where(eq(runs.id, runId))
      .catch(() => {});
  } finally {
    conn?.release();
  }
}
