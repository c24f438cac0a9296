import { and, asc, count, desc, eq, gt, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { crews, invitations, memberships, users, type Role } from "@/db/schema";

export interface CrewOfUser {
  crewId: number;
  name: string;
  role: Role;
}

export async function listCrewsOfUser(userId: number): Promise<CrewOfUser[]> {
  return db()
    .select({ crewId: crews.id, name: crews.name, role: memberships.role })
    .from(memberships)
    .innerJoin(crews, eq(crews.id, memberships.crewId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(crews.name));
}

export async function getMembershipRole(crewId: number, userId: number): Promise<Role | null> {
  const [row] = await db()
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.crewId, crewId), eq(memberships.userId, userId)))
    .limit(1);
  return row?.role ?? null;
}

export async function getCrew(crewId: number) {
  const [row] = await db().select().from(crews).where(eq(crews.id, crewId)).limit(1);
  return row ?? null;
}

export async function listMembers(crewId: number) {
  return db()
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, since: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.crewId, crewId))
    .orderBy(asc(users.name));
}

export async function countLeads(crewId: number): Promise<number> {
  const [row] = await db()
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.crewId, crewId), eq(memberships.role, "lead")));
  return row?.n ?? 0;
}

export async function listPendingInvitations(crewId: number, now = new Date()) {
  return db()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      createdAt: invitations.createdAt,
    })
    .from(invitations)
    .where(
      and(
        eq(invitations.crewId, crewId),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, now),
      ),
    )
    .orderBy(desc(invitations.createdAt));
}
