import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { runs } from "@/db/schema";
import { enqueueIngest } from "@/lib/jobs/enqueue";

/**
 * Queues every ready run of a crew (or of one of its builds) to be read and analysed again from
 * its stored original, so changed thresholds or a changed build record apply to the stored
 * debriefs. Each run moves ready → queued in one conditional update, so a run already being read
 * (or failed, or queued) is left alone rather than queued twice. The caller checks access.
 * @returns how many runs were queued
 */
export async function queueReadyRunsForAnalysis(scope: { crewId: number; buildId?: number }): Promise<number> {
  const where = [eq(runs.crewId, scope.crewId), eq(runs.status, "ready")];
  if (scope.buildId !== undefined) where.push(eq(runs.buildId, scope.buildId));
  const ready = await db().select({ id: runs.id }).from(runs).where(and(...where));
  let queued = 0;
  for (const r of ready) {
    const [claim] = await db().update(runs).set({ status: "queued", progress: 0 }).where(and(eq(runs.id, r.id), eq(runs.status, "ready")));
    if ((claim as unknown as { affectedRows: number }).affectedRows) {
      await enqueueIngest(r.id);
      queued++;
    }
  }
  return queued;
}
