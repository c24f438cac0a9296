import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { revokeShareLink } from "@/lib/share/share-links";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** Withdraws the link (leads of the run's crew); the page and its data stop answering at once. */
export const DELETE = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return revokeShareLink(actor, id);
});
