import { cookies } from "next/headers";
import { listCrewsOfUser, type CrewOfUser } from "@/db/queries/crews";
import { env } from "@/lib/env";

export const ACTIVE_CREW_COOKIE = "sortie-crew";
/** A year: the choice of crew is a preference, not a credential. */
export const ACTIVE_CREW_MAX_AGE_S = 365 * 24 * 3600;

/**
 * The one place the crew cookie is written. ASVS V3.4.1 Secure over https, V3.4.2 HttpOnly
 * (no script reads it), V3.4.3 SameSite=Lax, V3.4.5 path /.
 */
export async function setActiveCrewCookie(crewId: number): Promise<void> {
  (await cookies()).set(ACTIVE_CREW_COOKIE, String(crewId), {
    httpOnly: true,
    secure: env().APP_URL.startsWith("https://"),
    sameSite: "lax",
    path: "/",
    maxAge: ACTIVE_CREW_MAX_AGE_S,
  });
}

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
