import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { countLeads, getMembershipRole } from "@/db/queries/crews";
import { crews, memberships, type Role } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { roleChangeProblem } from "@/lib/auth/roles";
import { ForbiddenError, NotFoundError } from "@/lib/errors";

async function checkChange(actor: Actor, crewId: number, userId: number, newRole: Role | null) {
  const access = await requireCrewPermission(actor, crewId, "manageMembers", "Crew");
  const current = await getMembershipRole(crewId, userId);
  if (!current) throw new NotFoundError("Member");
  const problem = roleChangeProblem({ actorRole: access.role, targetCurrentRole: current, newRole, leadCount: await countLeads(crewId) });
  if (problem) throw new ForbiddenError(problem);
  return current;
}

export async function changeMemberRole(actor: Actor, crewId: number, userId: number, role: Role): Promise<void> {
  const from = await checkChange(actor, crewId, userId, role);
  await db().update(memberships).set({ role }).where(and(eq(memberships.crewId, crewId), eq(memberships.userId, userId)));
  await audit({ crewId, actorId: actor.user.id, action: "member.role-changed", targetType: "user", targetId: userId, detail: { from, to: role } });
}

export async function removeMember(actor: Actor, crewId: number, userId: number): Promise<void> {
  const role = await checkChange(actor, crewId, userId, null);
  await db().delete(memberships).where(and(eq(memberships.crewId, crewId), eq(memberships.userId, userId)));
  await audit({ crewId, actorId: actor.user.id, action: "member.removed", targetType: "user", targetId: userId, detail: { role } });
}

/** Any signed-in user may start another crew; they lead it. */
export async function createCrew(actor: Actor, name: string): Promise<number> {
  const crewId = await db().transaction(async (tx) => {
    const [{ id }] = await tx.insert(crews).values({ name }).$returningId();
    await tx.insert(memberships).values({ crewId: id, userId: actor.user.id, role: "lead" });
    return id;
  });
  await audit({ crewId, actorId: actor.user.id, action: "crew.created", targetType: "crew", targetId: crewId });
  return crewId;
}

export async function renameCrew(actor: Actor, crewId: number, name: string): Promise<void> {
  await requireCrewPermission(actor, crewId, "manageMembers", "Crew");
  await db().update(crews).set({ name }).where(eq(crews.id, crewId));
  await audit({ crewId, actorId: actor.user.id, action: "crew.renamed", targetType: "crew", targetId: crewId, detail: { name } });
}
