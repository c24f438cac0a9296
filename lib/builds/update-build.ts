import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { buildChanges, buildChannels, builds } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { queueReadyRunsForAnalysis } from "@/lib/runs/reanalyse";
import type { BuildUpdate, LinkSheetInput } from "@/lib/validations/build";
import { diffFields, diffSheet, type Changes } from "./history";

/** Lead-only; the crew is the build's own. */
const requireBuildEdit = (actor: Actor, buildId: number) => requireRecordPermission(actor, () => getBuild(buildId), "manageBuilds", "Build");

/**
 * Build fields the analysis reads (lib/ingest/analysis-inputs.ts): a change to one of them
 * re-analyses the build's runs. The link sheet's channels are read too (saveLinkSheet).
 */
export const ANALYSED_BUILD_FIELDS: readonly string[] = ["vehicleType", "batteryCells", "bandMhz", "rxSensitivityDbm", "failsafeAction", "failsafeWithinS", "thresholds"];

/** The failsafe plan is half of the link sheet (DESIGN.md §3): changing it makes a bench test stale. */
const PLAN_FIELDS: readonly string[] = ["failsafeAction", "failsafeWithinS"];

/** What a save changed, and how many of the build's runs it queued to be analysed again. */
export interface BuildSaved {
  changed: string[];
  reanalysing: number;
}

/** Queues the build's ready runs after a change the analysis reads, and says so in the audit log. */
async function reanalyseBuildRuns(actor: Actor, build: { id: number; crewId: number }, because: string[]): Promise<number> {
  const queued = await queueReadyRunsForAnalysis({ crewId: build.crewId, buildId: build.id });
  if (queued > 0) {
    await audit({ crewId: build.crewId, actorId: actor.user.id, action: "build.runs-reanalysed", targetType: "build", targetId: build.id, detail: { runs: queued, because } });
  }
  return queued;
}

/**
 * Changes the fields sent (null clears one) and records the change, field by field, in the
 * build's history. Nothing changed → nothing written. A change the analysis reads queues the
 * build's ready runs again; a change of the failsafe plan also dates the link sheet's change.
 * @returns the keys that changed and how many runs are being analysed again
 */
export async function updateBuild(actor: Actor, buildId: number, input: BuildUpdate): Promise<BuildSaved> {
  const { record } = await requireBuildEdit(actor, buildId);
  const changes = diffFields(record as unknown as Record<string, unknown>, input as Record<string, unknown>);
  const keys = Object.keys(changes);
  if (keys.length === 0) return { changed: [], reanalysing: 0 };
  const set: Record<string, unknown> = Object.fromEntries(keys.map((k) => [k, (input as Record<string, unknown>)[k]]));
  if (keys.some((k) => PLAN_FIELDS.includes(k))) set.linkSheetChangedAt = new Date();
  await db().transaction(async (tx) => {
    await tx.update(builds).set(set).where(eq(builds.id, buildId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.updated", targetType: "build", targetId: buildId, detail: { fields: keys } });
  const analysed = keys.filter((k) => ANALYSED_BUILD_FIELDS.includes(k));
  const reanalysing = analysed.length ? await reanalyseBuildRuns(actor, record, analysed) : 0;
  return { changed: keys, reanalysing };
}

/**
 * Replaces the link sheet (all 18 channels) and, when sent, the failsafe plan, as one entry in the
 * build's history. Any change dates the sheet (a bench test from before it is stale) and queues
 * the build's ready runs, so their stored debriefs follow the sheet.
 */
export async function saveLinkSheet(actor: Actor, buildId: number, input: LinkSheetInput): Promise<BuildSaved> {
  const { record } = await requireBuildEdit(actor, buildId);
  const plan = { failsafeAction: input.failsafeAction, failsafeWithinS: input.failsafeWithinS };
  const changes: Changes = {
    ...diffSheet(record.channels, input.channels),
    ...diffFields({ failsafeAction: record.failsafeAction, failsafeWithinS: record.failsafeWithinS } as Record<string, unknown>, plan),
  };
  const keys = Object.keys(changes);
  if (keys.length === 0) return { changed: [], reanalysing: 0 };
  const now = new Date();
  await db().transaction(async (tx) => {
    // The sheet is small and always whole: replace it rather than patch 18 rows one by one.
    await tx.delete(buildChannels).where(eq(buildChannels.buildId, buildId));
    await tx.insert(buildChannels).values(input.channels.map((c) => ({ buildId, ...c })));
    const planSet = Object.fromEntries(Object.entries(plan).filter(([, v]) => v !== undefined));
    await tx.update(builds).set({ ...planSet, updatedAt: now, linkSheetChangedAt: now }).where(eq(builds.id, buildId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.link-sheet-saved", targetType: "build", targetId: buildId, detail: { fields: keys.length } });
  // After the commit: the worker must read the new sheet.
  const reanalysing = await reanalyseBuildRuns(actor, record, ["link-sheet"]);
  return { changed: keys, reanalysing };
}

/** Retires a build (kept with its runs, no longer offered for new uploads) or brings it back. */
export async function setBuildRetired(actor: Actor, buildId: number, retired: boolean): Promise<{ retiredAt: Date | null }> {
  const { record } = await requireBuildEdit(actor, buildId);
  const was = record.retiredAt !== null;
  if (was === retired) return { retiredAt: record.retiredAt };
  const retiredAt = retired ? new Date() : null;
  await db().transaction(async (tx) => {
    await tx.update(builds).set({ retiredAt }).where(eq(builds.id, buildId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes: { retired: { from: was, to: retired } } });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: retired ? "build.retired" : "build.unretired", targetType: "build", targetId: buildId });
  return { retiredAt };
}
