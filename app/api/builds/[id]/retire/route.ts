import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { setBuildRetired } from "@/lib/builds/update-build";
import { retireSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const { retired } = await readJson(req, retireSchema);
  return setBuildRetired(actor, id, retired);
});
