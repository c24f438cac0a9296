/**
 * Failsafe bench tests recorded on a build (DESIGN.md §10): a lead records a bench run's failsafe
 * audit as a test of the build; a link-sheet change after it makes it stale. The crew is always
 * the build's own, and the run must be of that crew and attached to that build.
 */
import { getBenchTestOfRun, listBuildBenchTests, type BenchTestRow } from "@/db/queries/bench-tests";
import { getBuild } from "@/db/queries/builds";
import { getRun } from "@/db/queries/runs";
import { benchTests } from "@/db/schema";
import { db } from "@/db/client";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/roles";
import { ConflictError, NotFoundError, ValidationError } from "@/lib/errors";
import { benchTestFacts, isBenchTestStale } from "./bench-test-facts";

export type BenchTestView = BenchTestRow & { stale: boolean };

const withStale = (row: BenchTestRow, linkSheetChangedAt: Date | null): BenchTestView => ({ ...row, stale: isBenchTestStale(row.testedAt, linkSheetChangedAt) });

const isDuplicate = (e: unknown) => (e as { errno?: number; cause?: { errno?: number } }).errno === 1062 || (e as { cause?: { errno?: number } }).cause?.errno === 1062;

/**
 * Lead-only: records a ready bench run attached to the build as the build's failsafe bench test.
 * Idempotent: the same run recorded on the same build again returns the existing record
 * (`created: false`), so a double tap at the field or a retried request does not make two.
 * Refusals: another crew's build or run → 404; pilot or observer → 403; a retired build, a run
 * not attached to the build or not ready → 409; not a bench log, or its failsafe not exercised → 422.
 */
export async function recordBenchTest(actor: Actor, runId: number, input: { buildId: number; note?: string }): Promise<{ benchTest: BenchTestView; created: boolean }> {
  const { record: build } = await requireRecordPermission(actor, () => getBuild(input.buildId), "manageBuilds", "Build");
  const run = await getRun(runId);
  // A run of another crew is simply not found, whatever the build.
  if (!run || run.crewId !== build.crewId) throw new NotFoundError("Run");
  if (build.retiredAt) throw new ConflictError("This build is retired; bring it back before recording a bench test on it");
  if (run.buildId !== build.id) throw new ConflictError(`This run is not attached to ${build.name}; attach it to the build first`);
  if (run.status !== "ready") throw new ConflictError("This run is not analysed yet; record it once its debrief is ready");
  const reading = benchTestFacts(run.summary);
  if (!reading.ok) throw new ValidationError(reading.message, { fields: { runId: [reading.message] } });

  const existing = await getBenchTestOfRun(build.id, run.id);
  if (existing) return { benchTest: withStale(existing, build.linkSheetChangedAt), created: false };
  const { facts } = reading;
  try {
    await db()
      .insert(benchTests)
      .values({
        buildId: build.id,
        runId: run.id,
        recordedBy: actor.user.id,
        // When the test was done: the log's own start, else when it was uploaded.
        testedAt: run.startedAt ?? run.createdAt,
        result: facts.result,
        commandedLatencyS: facts.commandedLatencyS,
        flownLatencyS: facts.flownLatencyS,
        flownState: facts.flownState,
        action: facts.action,
        failsafe: facts.failsafe as Record<string, unknown>,
        note: input.note ?? null,
      });
  } catch (e) {
    // Two requests at once: the unique (build, run) index lets one through; the other reads it.
    if (!isDuplicate(e)) throw e;
    const raced = await getBenchTestOfRun(build.id, run.id);
    if (!raced) throw e;
    return { benchTest: withStale(raced, build.linkSheetChangedAt), created: false };
  }
  const saved = (await getBenchTestOfRun(build.id, run.id))!;
  await audit({
    crewId: build.crewId,
    actorId: actor.user.id,
    action: "build.bench-test-recorded",
    targetType: "build",
    targetId: build.id,
    detail: { runId: run.id, benchTestId: saved.id, result: facts.result },
  });
  return { benchTest: withStale(saved, build.linkSheetChangedAt), created: true };
}

/** The build's bench tests, latest first, each marked stale or not (anyone who may read the build). */
export async function listBenchTests(actor: Actor, buildId: number): Promise<{ benchTests: BenchTestView[]; linkSheetChangedAt: Date | null }> {
  const { record } = await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  const rows = await listBuildBenchTests(record.id);
  return { benchTests: rows.map((r) => withStale(r, record.linkSheetChangedAt)), linkSheetChangedAt: record.linkSheetChangedAt };
}

/**
 * The latest bench test of a build the caller has already been allowed to read, with the stale
 * flag, and how many there are in all (build page, checklist).
 */
export async function latestBenchTest(build: { id: number; linkSheetChangedAt: Date | null }): Promise<{ latest: BenchTestView | null; earlier: BenchTestView[] }> {
  const rows = (await listBuildBenchTests(build.id, 20)).map((r) => withStale(r, build.linkSheetChangedAt));
  return { latest: rows[0] ?? null, earlier: rows.slice(1) };
}

/**
 * What the debrief offers about a bench run attached to a build: null when it is not one (not
 * ready, not a bench log, no build). Leads may record it; everyone sees when it was recorded.
 */
export async function benchTestOffer(actor: Actor, runId: number) {
  const { record: run, access } = await requireRecordPermission(actor, () => getRun(runId), "read", "Run");
  if (run.status !== "ready" || run.buildId === null) return null;
  const reading = benchTestFacts(run.summary);
  if (!reading.ok && reading.problem === "not-bench") return null;
  const build = await getBuild(run.buildId);
  if (!build || build.crewId !== run.crewId) return null;
  const recorded = await getBenchTestOfRun(build.id, run.id);
  return {
    runId: run.id,
    build: { id: build.id, name: build.name, retired: build.retiredAt !== null },
    mayRecord: can(access.role, "manageBuilds") && build.retiredAt === null,
    recorded: recorded ? withStale(recorded, build.linkSheetChangedAt) : null,
    /** Why it cannot be recorded (its failsafe was not exercised), or null. */
    problem: reading.ok ? null : reading.message,
    facts: reading.ok ? reading.facts : null,
  };
}

export type BenchTestOffer = NonNullable<Awaited<ReturnType<typeof benchTestOffer>>>;
