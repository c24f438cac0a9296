import { and, eq, gt, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { getCrew, getMembershipRole } from "@/db/queries/crews";
import { getUserWithSecretByEmail } from "@/db/queries/users";
import { crews, invitations, memberships, users, type Role } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { hashPassword } from "@/lib/auth/password";
import { hashToken, newToken } from "@/lib/auth/secrets";
import { env } from "@/lib/env";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "@/lib/errors";
import { invitationMail } from "@/lib/mail/templates";
import { queueMail } from "@/lib/mail/outbox";

export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000;

/** Lead-only: e-mails a one-time link; a newer invitation to the same address replaces an older one. */
export async function inviteMember(
  actor: Actor,
  crewId: number,
  input: { email: string; role: Role },
  now = new Date(),
): Promise<{ invitationId: number; expiresAt: Date }> {
  await requireCrewPermission(actor, crewId, "manageMembers", "Crew");
  const existing = await getUserWithSecretByEmail(input.email);
  if (existing && (await getMembershipRole(crewId, existing.id))) {
    throw new ConflictError(`${input.email} is already a member of this crew`);
  }
  const crew = (await getCrew(crewId))!;
  const token = newToken();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const invitationId = await db().transaction(async (tx) => {
    await tx
      .update(invitations)
      .set({ revokedAt: now })
      .where(and(eq(invitations.crewId, crewId), eq(invitations.email, input.email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
    const [{ id }] = await tx
      .insert(invitations)
      .values({ crewId, email: input.email, role: input.role, tokenHash: hashToken(token), invitedBy: actor.user.id, expiresAt })
      .$returningId();
    return id;
  });
  const url = `${env().APP_URL}/invite/${encodeURIComponent(token)}`;
  await queueMail(invitationMail({ to: input.email, crewName: crew.name, role: input.role, invitedByName: actor.user.name, url, expiresAt }), "invitation");
  await audit({ crewId, actorId: actor.user.id, action: "member.invited", targetType: "invitation", targetId: invitationId, detail: { email: input.email, role: input.role } });
  return { invitationId, expiresAt };
}

export type InvitationState =
  | { state: "open"; crewName: string; email: string; role: Role; accountExists: boolean; expiresAt: Date }
  | { state: "spent" };

/** What the accept page shows for a token (without consuming it). */
export async function describeInvitation(token: string, now = new Date()): Promise<InvitationState> {
  const [row] = await db()
    .select({ inv: invitations, crewName: crews.name })
    .from(invitations)
    .innerJoin(crews, eq(crews.id, invitations.crewId))
    .where(eq(invitations.tokenHash, hashToken(token)))
    .limit(1);
  if (!row || row.inv.acceptedAt || row.inv.revokedAt || row.inv.expiresAt <= now) return { state: "spent" };
  const accountExists = !!(await getUserWithSecretByEmail(row.inv.email));
  return { state: "open", crewName: row.crewName, email: row.inv.email, role: row.inv.role, accountExists, expiresAt: row.inv.expiresAt };
}

const spentInvitation = "This invitation has expired, was revoked or was already used; ask the crew lead for a new one";

/**
 * Consumes the invitation once. A signed-in user must be the invited address; without a session
 * a new account is created for the invited address.
 */
export async function acceptInvitation(
  token: string,
  who: { userId: number } | { name: string; password: string },
  now = new Date(),
): Promise<{ crewId: number; userId: number; email: string }> {
  const passwordHash = "password" in who ? await hashPassword(who.password) : null;
  const result = await db().transaction(async (tx) => {
    const [inv] = await tx.select().from(invitations).where(eq(invitations.tokenHash, hashToken(token))).for("update");
    if (!inv || inv.acceptedAt || inv.revokedAt || inv.expiresAt <= now) throw new ValidationError(spentInvitation);
    let userId: number;
    if ("userId" in who) {
      const [u] = await tx.select({ email: users.email }).from(users).where(eq(users.id, who.userId));
      if (!u) throw new NotFoundError("User");
      if (u.email !== inv.email) {
        throw new ForbiddenError(`This invitation was sent to ${inv.email}; sign in with that address to accept it`);
      }
      userId = who.userId;
    } else {
      const [taken] = await tx.select({ id: users.id }).from(users).where(eq(users.email, inv.email));
      if (taken) throw new ConflictError(`An account for ${inv.email} exists; sign in first, then open the link again`);
      [{ id: userId }] = await tx.insert(users).values({ email: inv.email, name: who.name, passwordHash: passwordHash! }).$returningId();
    }
    const [member] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.crewId, inv.crewId), eq(memberships.userId, userId)));
    if (!member) await tx.insert(memberships).values({ crewId: inv.crewId, userId, role: inv.role });
    await tx.update(invitations).set({ acceptedAt: now, acceptedBy: userId }).where(eq(invitations.id, inv.id));
    return { crewId: inv.crewId, userId, email: inv.email, role: inv.role, invitationId: inv.id };
  });
  await audit({ crewId: result.crewId, actorId: result.userId, action: "member.joined", targetType: "invitation", targetId: result.invitationId, detail: { role: result.role } });
  return { crewId: result.crewId, userId: result.userId, email: result.email };
}

export async function revokeInvitation(actor: Actor, invitationId: number, now = new Date()): Promise<void> {
  const [inv] = await db().select().from(invitations).where(eq(invitations.id, invitationId)).limit(1);
  if (!inv) throw new NotFoundError("Invitation");
  await requireCrewPermission(actor, inv.crewId, "manageMembers", "Invitation");
  await db()
    .update(invitations)
    .set({ revokedAt: now })
    .where(and(eq(invitations.id, invitationId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, now)));
  await audit({ crewId: inv.crewId, actorId: actor.user.id, action: "invitation.revoked", targetType: "invitation", targetId: invitationId });
}
