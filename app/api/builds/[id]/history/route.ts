import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { getBuildHistory } from "@/lib/builds/build-view";
import { idSchema } from "@/lib/validations/crew";

export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return { changes: await getBuildHistory(actor, id) };
});
