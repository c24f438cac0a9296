import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { crews } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { queueReadyRunsForAnalysis } from "@/lib/runs/reanalyse";
import type { ThresholdOverrides } from "@/lib/validations/thresholds";

export async function getCrewThresholds(actor: Actor, crewId: number): Promise<ThresholdOverrides> {
  await requireCrewPermission(actor, crewId, "read", "Crew");
  const [row] = await db().select({ thresholds: crews.thresholds }).from(crews).where(eq(crews.id, crewId));
  return (row?.thresholds as ThresholdOverrides | null) ?? {};
}

/** Lead-only: replaces the crew's overrides (an empty object means the defaults). */
export async function setCrewThresholds(actor: Actor, crewId: number, overrides: ThresholdOverrides): Promise<void> {
  await requireCrewPermission(actor, crewId, "manageThresholds", "Crew");
  await db().update(crews).set({ thresholds: overrides as Record<string, number> }).where(eq(crews.id, crewId));
  await audit({ crewId, actorId: actor.user.id, action: "crew.thresholds-changed", targetType: "crew", targetId: crewId, detail: overrides });
}

/**
 * Lead-only: reads every ready run of the crew again from its stored original, so new thresholds
 * (or a changed build) apply to the stored runs. Returns how many were queued.
 */
export async function reanalyseCrewRuns(actor: Actor, crewId: number): Promise<number> {
  await requireCrewPermission(actor, crewId, "manageThresholds", "Crew");
  const queued = await queueReadyRunsForAnalysis({ crewId });
  await audit({ crewId, actorId: actor.user.id, action: "crew.runs-reanalysed", targetType: "crew", targetId: crewId, detail: { runs: queued } });
  return queued;
}
