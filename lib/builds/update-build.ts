import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { buildChanges, buildChannels, builds } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import type { BuildUpdate, LinkSheetInput } from "@/lib/validations/build";
import { diffFields, diffSheet, type Changes } from "./history";

/** Lead-only; the crew is the build's own. */
const requireBuildEdit = (actor: Actor, buildId: number) => requireRecordPermission(actor, () => getBuild(buildId), "manageBuilds", "Build");

/**
 * Changes the fields sent (null clears one) and records the change, field by field, in the
 * build's history. Nothing changed → nothing written.
 * @returns the keys that changed
 */
export async function updateBuild(actor: Actor, buildId: number, input: BuildUpdate): Promise<{ changed: string[] }> {
  const { record } = await requireBuildEdit(actor, buildId);
  const changes = diffFields(record as unknown as Record<string, unknown>, input as Record<string, unknown>);
  const keys = Object.keys(changes);
  if (keys.length === 0) return { changed: [] };
  const set = Object.fromEntries(keys.map((k) => [k, (input as Record<string, unknown>)[k]]));
  await db().transaction(async (tx) => {
    await tx.update(builds).set(set).where(eq(builds.id, buildId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.updated", targetType: "build", targetId: buildId, detail: { fields: keys } });
  return { changed: keys };
}

/**
 * Replaces the link sheet (all 18 channels) and, when sent, the failsafe plan, as one entry in the
 * build's history.
 */
export async function saveLinkSheet(actor: Actor, buildId: number, input: LinkSheetInput): Promise<{ changed: string[] }> {
  const { record } = await requireBuildEdit(actor, buildId);
  const plan = { failsafeAction: input.failsafeAction, failsafeWithinS: input.failsafeWithinS };
  const changes: Changes = {
    ...diffSheet(record.channels, input.channels),
    ...diffFields({ failsafeAction: record.failsafeAction, failsafeWithinS: record.failsafeWithinS } as Record<string, unknown>, plan),
  };
  const keys = Object.keys(changes);
  if (keys.length === 0) return { changed: [] };
  await db().transaction(async (tx) => {
    // The sheet is small and always whole: replace it rather than patch 18 rows one by one.
    await tx.delete(buildChannels).where(eq(buildChannels.buildId, buildId));
    await tx.insert(buildChannels).values(input.channels.map((c) => ({ buildId, ...c })));
    const planSet = Object.fromEntries(Object.entries(plan).filter(([, v]) => v !== undefined));
    await tx.update(builds).set({ ...planSet, updatedAt: new Date() }).where(eq(builds.id, buildId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.link-sheet-saved", targetType: "build", targetId: buildId, detail: { fields: keys.length } });
  return { changed: keys };
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
