import type { Role } from "@/db/schema/crews";
import { getMembershipRole } from "@/db/queries/crews";
import { ForbiddenError, NotFoundError } from "@/lib/errors";
import type { Actor } from "./actor";
import { can, type Permission } from "./roles";

export interface CrewAccess {
  crewId: number;
  role: Role;
}

/**
 * Checks that the actor belongs to the crew and that its role grants `permission`.
 * Not a member → 404 (the crew's records are not confirmed to exist); member with too low a role → 403.
 */
export async function requireCrewPermission(
  actor: Actor,
  crewId: number,
  permission: Permission,
  what = "Record",
): Promise<CrewAccess> {
  const role = await getMembershipRole(crewId, actor.user.id);
  if (!role) throw new NotFoundError(what);
  if (!can(role, permission)) throw new ForbiddenError();
  return { crewId, role };
}

/**
 * Loads a record, resolves its crew from the record itself (never from what the client says)
 * and checks the permission there.
 */
export async function requireRecordPermission<T extends { crewId: number }>(
  actor: Actor,
  load: () => Promise<T | null>,
  permission: Permission,
  what: string,
): Promise<{ record: T; access: CrewAccess }> {
  const record = await load();
  if (!record) throw new NotFoundError(what);
  const access = await requireCrewPermission(actor, record.crewId, permission, what);
  return { record, access };
}
