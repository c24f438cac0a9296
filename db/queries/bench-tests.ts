import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { benchTests, runs, users } from "@/db/schema";

const columns = {
  id: benchTests.id,
  buildId: benchTests.buildId,
  runId: benchTests.runId,
  testedAt: benchTests.testedAt,
  recordedAt: benchTests.recordedAt,
  result: benchTests.result,
  commandedLatencyS: benchTests.commandedLatencyS,
  flownLatencyS: benchTests.flownLatencyS,
  flownState: benchTests.flownState,
  action: benchTests.action,
  failsafe: benchTests.failsafe,
  note: benchTests.note,
  runTitle: runs.title,
  recordedByName: users.name,
};

const base = () => db().select(columns).from(benchTests).leftJoin(runs, eq(runs.id, benchTests.runId)).leftJoin(users, eq(users.id, benchTests.recordedBy));

/** A build's failsafe bench tests, the latest test first (by when it was done, then recorded). */
export async function listBuildBenchTests(buildId: number, limit = 50) {
  return base().where(eq(benchTests.buildId, buildId)).orderBy(desc(benchTests.testedAt), desc(benchTests.id)).limit(limit);
}

export type BenchTestRow = Awaited<ReturnType<typeof listBuildBenchTests>>[number];

/** The bench test recorded on a build from one run, if any. */
export async function getBenchTestOfRun(buildId: number, runId: number): Promise<BenchTestRow | null> {
  const [row] = await base().where(and(eq(benchTests.buildId, buildId), eq(benchTests.runId, runId))).limit(1);
  return row ?? null;
}
