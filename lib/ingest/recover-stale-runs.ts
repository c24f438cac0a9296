import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { runs } from "@/db/schema";

/**
 * Ingest jobs live in the server process, so after a restart nothing is reading the runs left
 * queued or parsing: they are marked failed with a re-parse hint (their samples were never
 * committed, and the original is intact in storage). Single-instance assumption; see README.
 */
export async function recoverStaleRuns(onlyCrewId?: number): Promise<number> {
  const stale = inArray(runs.status, ["queued", "parsing", "analysing"]);
  const [result] = await db()
    .update(runs)
    .set({ status: "failed", progress: 0, error: "Sortie restarted while this log was being read; re-parse it to try again" })
    .where(onlyCrewId ? and(stale, eq(runs.crewId, onlyCrewId)) : stale);
  return (result as unknown as { affectedRows?: number }).affectedRows ?? 0;
}
