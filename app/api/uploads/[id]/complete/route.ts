import { z } from "zod";
import { apiRoute, parseParams, readOptionalJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { completeUpload } from "@/lib/ingest/uploads";
import { idSchema } from "@/lib/validations/crew";
import { uploadCompleteSchema } from "@/lib/validations/upload";

export const runtime = "nodejs";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const body = await readOptionalJson(req, uploadCompleteSchema);
  return completeUpload(actor, id, body);
});
