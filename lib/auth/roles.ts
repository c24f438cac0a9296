import type { Role } from "@/db/schema/crews";

const rank: Record<Role, number> = { observer: 1, pilot: 2, lead: 3 };

/** True when `actual` is at least `required` in the order lead > pilot > observer. */
export function roleAtLeast(actual: Role | null | undefined, required: Role): boolean {
  if (!actual) return false;
  return rank[actual] >= rank[required];
}

/** What each role may do; the single source for UI hints and server checks. */
export const permissions = {
  read: "observer",
  uploadLog: "pilot",
  editOwnRun: "pilot",
  writeNote: "pilot",
  manageRoutePlans: "pilot",
  manageBuilds: "lead",
  manageMembers: "lead",
  manageThresholds: "lead",
  signOff: "lead",
  share: "lead",
  delete: "lead",
} as const satisfies Record<string, Role>;

export type Permission = keyof typeof permissions;

export function can(role: Role | null | undefined, permission: Permission): boolean {
  return roleAtLeast(role, permissions[permission]);
}

/**
 * A lead may change any role, but a crew must keep at least one lead: returns why not, or null.
 */
export function roleChangeProblem(args: {
  actorRole: Role;
  targetCurrentRole: Role;
  newRole: Role | null;
  leadCount: number;
}): string | null {
  if (args.actorRole !== "lead") return "Only a lead can change roles or remove members";
  const losingLead = args.targetCurrentRole === "lead" && args.newRole !== "lead";
  if (losingLead && args.leadCount <= 1) return "A crew needs at least one lead; make someone else lead first";
  return null;
}
