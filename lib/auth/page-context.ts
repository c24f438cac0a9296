import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import type { CrewOfUser } from "@/db/queries/crews";
import { getActiveCrew } from "./active-crew";
import { getActor, type Actor } from "./actor";

export interface PageContext {
  actor: Actor;
  crew: CrewOfUser | null;
  crews: CrewOfUser[];
}

/** For pages of the signed-in app: the user and the crew they work in, or a redirect to sign-in. */
export const getPageContext = cache(async (): Promise<PageContext> => {
  const actor = await getActor();
  if (!actor) {
    const path = (await headers()).get("x-sortie-path") ?? "/dashboard";
    redirect(`/sign-in?callbackUrl=${encodeURIComponent(path)}`);
  }
  const { active, all } = await getActiveCrew(actor.user.id);
  return { actor, crew: active, crews: all };
});

/** As getPageContext, for pages that only make sense inside a crew. */
export async function getCrewPageContext(): Promise<PageContext & { crew: CrewOfUser }> {
  const ctx = await getPageContext();
  if (!ctx.crew) redirect("/settings?nocrew=1");
  return ctx as PageContext & { crew: CrewOfUser };
}
