"use server";

import { revalidatePath } from "next/cache";
import { getMembershipRole } from "@/db/queries/crews";
import { setActiveCrewCookie } from "@/lib/auth/active-crew";
import { requireActor } from "@/lib/auth/actor";
import { NotFoundError } from "@/lib/errors";
import { switchCrewSchema } from "@/lib/validations/crew";

/** Chooses the crew the app works in; only a crew the user belongs to is accepted. */
export async function switchCrewAction(form: FormData): Promise<void> {
  const actor = await requireActor();
  const { crewId } = switchCrewSchema.parse({ crewId: form.get("crewId") });
  if (!(await getMembershipRole(crewId, actor.user.id))) throw new NotFoundError("Crew");
  await setActiveCrewCookie(crewId);
  revalidatePath("/", "layout");
}
