import { z } from "zod";
import { apiRoute, parseParams, readOptionalJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { reparseRun } from "@/lib/ingest/runs";
import { idSchema } from "@/lib/validations/crew";
import { reparseSchema } from "@/lib/validations/upload";

export const runtime = "nodejs";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const body = await readOptionalJson(req, reparseSchema);
  return reparseRun(actor, id, body);
});
