import { cookies } from "next/headers";
import { listCrewsOfUser, type CrewOfUser } from "@/db/queries/crews";

export const ACTIVE_CREW_COOKIE = "sortie-crew";

/**
 * The crew a signed-in user is working in. The cookie only chooses among the user's own
 * memberships, so a forged value falls back to the first crew rather than granting anything.
 */
export async function getActiveCrew(userId: number): Promise<{ active: CrewOfUser | null; all: CrewOfUser[] }> {
  const all = await listCrewsOfUser(userId);
  const wanted = Number((await cookies()).get(ACTIVE_CREW_COOKIE)?.value);
  const active = all.find((c) => c.crewId === wanted) ?? all[0] ?? null;
  return { active, all };
}
