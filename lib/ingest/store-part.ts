import { eq } from "drizzle-orm";
import { timesUsable } from "@/lib/parsers/warnings";
import type { MySql2Database } from "drizzle-orm/mysql2";
import type { PoolConnection } from "mysql2/promise";
import type { schema } from "@/db/client";
import { events, runs, type RunWarning } from "@/db/schema";
import { alertAfterAnalysis } from "@/lib/alerts/run-alert";
import { analyseRun } from "@/lib/analysis/analyse-run";
import type { AnalysisEvent } from "@/lib/analysis/types";
import type { ParseLogResult } from "@/lib/parsers/parse-log";
import { partStartedAt } from "@/lib/parsers/run-splitter";
import { sampleFields, type LogFormat } from "@/lib/parsers/types";
import { seriesBlobs } from "@/lib/series/levels";
import { writeSeriesLevels } from "@/lib/series/store";
import type { loadAnalysisInputs } from "./analysis-inputs";
import type { LoadedPart } from "./part-loader";

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

/** JSON with keys in a fixed order, so a stored summary and a new one compare by value. */
function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, x) =>
    x && typeof x === "object" && !Array.isArray(x) ? Object.fromEntries(Object.entries(x as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1))) : x,
  );
}

export interface StorePartContext {
  conn: PoolConnection;
  tx: MySql2Database<typeof schema>;
  format: LogFormat;
  parsed: ParseLogResult;
  warnings: RunWarning[];
  /** Parts in the file: one keeps the parser's own field list. */
  partCount: number;
  inputs: Awaited<ReturnType<typeof loadAnalysisInputs>>;
}

/**
 * Analyses one loaded part and writes its events, display levels and figures into its run row,
 * inside the ingest transaction, then the "act" alert decision for it. A lead's sign-off stays
 * when the part's figures come out exactly as before (another part was re-parsed, or nothing the
 * analysis reads changed); new figures need a new sign-off.
 */
export async function storePart(ctx: StorePartContext, p: LoadedPart): Promise<void> {
  const { tx, parsed } = ctx;
  const series = p.collector.series(parsed.modeNames);
  const analysis = analyseRun(series, { ...ctx.inputs, timesUsable: timesUsable(ctx.warnings) });
  for (let i = 0; i < analysis.events.length; i += 500) {
    await tx.insert(events).values(analysis.events.slice(i, i + 500).map((e) => eventRow(p.runId, e)));
  }
  // Display levels for the charts and the map, from the same arrays (lib/series/levels.ts).
  await writeSeriesLevels(ctx.conn, p.runId, seriesBlobs(series, analysis.perSample));

  const single = ctx.partCount === 1;
  const summary = JSON.parse(
    JSON.stringify({
      ...analysis.summary,
      fieldsPresent: single ? parsed.fieldsPresent : sampleFields.filter((f) => p.fieldsPresent.has(f)),
      hasRc: single ? parsed.hasRc : parsed.hasRc && p.hasRc,
      unplaced: parsed.unplaced ?? [],
    }),
  ) as Record<string, unknown>;
  const startedAt = partStartedAt(parsed.startedAt, p.part.offsetS);
  // Never negative: a log whose clock steps back must not show a negative run.
  const d = analysis.summary.durationS;
  const durationS = d != null && Number.isFinite(d) ? Math.max(0, d) : null;
  const prev = p.previous;
  // The row is "queued" or "parsing" by now; a failed read in between left sample_count at 0.
  const sameFigures =
    prev != null &&
    prev.summary != null &&
    prev.sampleCount === p.part.sampleCount &&
    (prev.startedAt?.getTime() ?? null) === (startedAt?.getTime() ?? null) &&
    canonical(prev.summary) === canonical(summary);
  await tx
    .update(runs)
    .set({
      status: "ready",
      progress: 1,
      format: ctx.format,
      part: p.part.part,
      ...(sameFigures ? {} : { signedOffBy: null, signedOffAt: null }),
      sampleCount: p.part.sampleCount,
      startedAt,
      durationS,
      distanceM: analysis.summary.distanceM,
      verdict: analysis.summary.verdict.level,
      warnings: ctx.warnings,
      modeNames: parsed.modeNames,
      columnMap: (parsed.columnMap as Record<string, unknown> | undefined) ?? null,
      summary,
      error: null,
    })
    .where(eq(runs.id, p.runId));
  // The alert decision and its mail commit with the figures: exactly once per analysis.
  await alertAfterAnalysis(p.runId, prev?.verdict ?? null, tx);
}
