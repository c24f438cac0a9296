import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { completePhotoUpload } from "@/lib/builds/photos";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** After the PUT: checks the stored size and the image's first bytes, then adds it to the build. */
export const POST = apiRoute<{ id: string; photoId: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id, photoId } = parseParams(ctx.params, z.object({ id: idSchema, photoId: idSchema }));
  return completePhotoUpload(actor, id, photoId);
});
