import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { moveRunToBuild } from "@/lib/builds/move-run";
import { moveRunSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** Moves the run to another build of its crew (or none) and queues it to be analysed again. */
export const PUT = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const { buildId } = await readJson(req, moveRunSchema);
  return moveRunToBuild(actor, id, buildId);
});
