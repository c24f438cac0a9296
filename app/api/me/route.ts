import { listCrewsOfUser } from "@/db/queries/crews";
import { apiRoute } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";

export const GET = apiRoute(async () => {
  const actor = await requireActor();
  return { user: actor.user, via: actor.via, crews: await listCrewsOfUser(actor.user.id) };
});
