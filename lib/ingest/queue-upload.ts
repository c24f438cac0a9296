import { asc, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { runs, type NewRun } from "@/db/schema";
import { enqueueIngest } from "@/lib/jobs/enqueue";

const IN_PROGRESS = new Set<string>(["queued", "parsing", "analysing"]);

export interface QueueUploadOptions {
  /** Queue only when the run is ready (a re-analysis leaves failed and waiting runs alone). */
  onlyIfReady?: boolean;
  /** Values to set on the named run only (e.g. its new build). */
  setRun?: Partial<NewRun>;
  /** Values to set on every run of the upload (e.g. a CSV column map: it belongs to the file). */
  setAll?: Partial<NewRun>;
}

export interface QueuedUpload {
  /** The upload's part 1, whose ingest job reads the file for every part. */
  jobRunId: number;
  /** Runs of the upload now waiting to be read. */
  runIds: number[];
}

/**
 * Puts the upload a run came from back in the ingest queue: a re-parse, a re-analysis or a build
 * change of any part reads the whole file again and updates every part (lib/ingest/ingest-run.ts).
 * One transaction locks the upload's runs first, so of two requests racing only one queues it,
 * and an upload being read (any part queued, parsing or analysing) is refused with null.
 */
export async function queueUploadOfRun(runId: number, opts: QueueUploadOptions = {}): Promise<QueuedUpload | null> {
  const queued = await db().transaction(async (tx) => {
    const [self] = await tx.select({ uploadId: runs.uploadId }).from(runs).where(eq(runs.id, runId));
    if (!self) return null;
    const parts = await tx
      .select({ id: runs.id, part: runs.part, status: runs.status })
      .from(runs)
      .where(eq(runs.uploadId, self.uploadId))
      .orderBy(asc(runs.part))
      .for("update");
    const me = parts.find((p) => p.id === runId);
    if (!me || parts.some((p) => IN_PROGRESS.has(p.status))) return null;
    if (opts.onlyIfReady && me.status !== "ready") return null;
    const ids = parts.map((p) => p.id);
    await tx
      .update(runs)
      .set({ ...opts.setAll, status: "queued", progress: 0, error: null })
      .where(inArray(runs.id, ids));
    if (opts.setRun && Object.keys(opts.setRun).length) await tx.update(runs).set(opts.setRun).where(eq(runs.id, runId));
    return { jobRunId: (parts.find((p) => p.part === 1) ?? parts[0]).id, runIds: ids };
  });
  if (queued) await enqueueIngest(queued.jobRunId);
  return queued;
}
