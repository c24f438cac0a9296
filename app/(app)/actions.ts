"use server";

import { cookies } from "next/headers";
import { revalidatePath } from "next/cache";
import { getMembershipRole } from "@/db/queries/crews";
import { ACTIVE_CREW_COOKIE } from "@/lib/auth/active-crew";
import { requireActor } from "@/lib/auth/actor";
import { NotFoundError } from "@/lib/errors";
import { switchCrewSchema } from "@/lib/validations/crew";

/** Chooses the crew the app works in; only a crew the user belongs to is accepted. */
export async function switchCrewAction(form: FormData): Promise<void> {
  const actor = await requireActor();
  const { crewId } = switchCrewSchema.parse({ crewId: form.get("crewId") });
  if (!(await getMembershipRole(crewId, actor.user.id))) throw new NotFoundError("Crew");
  (await cookies()).set(ACTIVE_CREW_COOKIE, String(crewId), { httpOnly: true, sameSite: "lax", path: "/", maxAge: 365 * 24 * 3600 });
  revalidatePath("/", "layout");
}
