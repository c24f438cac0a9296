import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { runs } from "@/db/schema";
import { queueUploadOfRun } from "@/lib/ingest/queue-upload";

/**
 * Queues every ready run of a crew (or of one of its builds) to be read and analysed again from
 * its stored original, so changed thresholds or a changed build record apply to the stored
 * debriefs. A file holding several runs is read once for all of them: each upload is queued once,
 * through one of its ready runs in scope, and every part of it is analysed again. An upload already
 * being read (or failed, or queued) is left alone rather than queued twice. The caller checks access.
 * @returns how many runs were queued (every part of each upload queued)
 */
export async function queueReadyRunsForAnalysis(scope: { crewId: number; buildId?: number }): Promise<number> {
  const where = [eq(runs.crewId, scope.crewId), eq(runs.status, "ready")];
  if (scope.buildId !== undefined) where.push(eq(runs.buildId, scope.buildId));
  const ready = await db().select({ id: runs.id, uploadId: runs.uploadId }).from(runs).where(and(...where));
  const onePerUpload = new Map<number, number>();
  for (const r of ready) if (!onePerUpload.has(r.uploadId)) onePerUpload.set(r.uploadId, r.id);
  let queued = 0;
  for (const runId of onePerUpload.values()) {
    const q = await queueUploadOfRun(runId, { onlyIfReady: true });
    queued += q?.runIds.length ?? 0;
  }
  return queued;
}
