import { db } from "@/db/client";
import { buildChannels, builds } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import type { BuildCreate } from "@/lib/validations/build";

/** Lead-only. Every build starts with an empty link sheet of 18 unused channels. */
export async function createBuild(actor: Actor, crewId: number, input: Omit<BuildCreate, "crewId">): Promise<number> {
  await requireCrewPermission(actor, crewId, "manageBuilds", "Crew");
  const id = await db().transaction(async (tx) => {
    const [{ id }] = await tx.insert(builds).values({ ...input, crewId, createdBy: actor.user.id }).$returningId();
    await tx.insert(buildChannels).values(Array.from({ length: 18 }, (_, i) => ({ buildId: id, channel: i + 1 })));
    return id;
  });
  await audit({ crewId, actorId: actor.user.id, action: "build.created", targetType: "build", targetId: id });
  return id;
}
