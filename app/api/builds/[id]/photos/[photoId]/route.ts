import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { deletePhoto } from "@/lib/builds/photos";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

export const DELETE = apiRoute<{ id: string; photoId: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id, photoId } = parseParams(ctx.params, z.object({ id: idSchema, photoId: idSchema }));
  await deletePhoto(actor, id, photoId);
  return { deleted: true };
});
