import { getBuild } from "@/db/queries/builds";
import { getRun } from "@/db/queries/runs";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/roles";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "@/lib/errors";
import { queueUploadOfRun } from "@/lib/ingest/queue-upload";

const BUSY = "This run is being read right now; wait for it to finish";

/**
 * Attaches a run to another build of its own crew (or to none) and reads it again, so the failsafe
 * plan, link sheet, sensitivity and band of the new build apply. Leads may move any run, pilots
 * their own. The build change and the re-queue are one conditional update, so a run already being
 * read is refused rather than analysed with the old build.
 */
export async function moveRunToBuild(actor: Actor, runId: number, buildId: number | null) {
  const { record: run, access } = await requireRecordPermission(actor, () => getRun(runId), "editOwnRun", "Run");
  if (!can(access.role, "delete") && run.pilotId !== actor.user.id) throw new ForbiddenError("Only the run's pilot or a lead can move it to another build");
  if (buildId !== null) {
    const build = await getBuild(buildId);
    // Another crew's build is simply not found.
    if (!build || build.crewId !== run.crewId) throw new NotFoundError("Build");
    if (build.retiredAt) throw new ValidationError("That build is retired; bring it back first", { fields: { buildId: ["Choose a build in service"] } });
  }
  if (run.buildId === buildId) return { runId, buildId, status: run.status, requeued: false };
  // The build change and the re-queue are one locked step; the whole file is read again, every
  // part with its own build.
  const queued = await queueUploadOfRun(runId, { setRun: { buildId } });
  if (!queued) throw new ConflictError(BUSY);
  await audit({ crewId: run.crewId, actorId: actor.user.id, action: "run.build-changed", targetType: "run", targetId: runId, detail: { from: run.buildId, to: buildId } });
  return { runId, buildId, status: "queued" as const, requeued: true };
}
