import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { getSheetCheck } from "@/lib/builds/build-check";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return { check: await getSheetCheck(actor, id) };
});
