import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { createPhotoUpload, listPhotos } from "@/lib/builds/photos";
import { photoCreateSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

const params = z.object({ id: idSchema });

export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  return { photos: await listPhotos(actor, id) };
});

/** Presigns the PUT of one photo (JPEG, PNG or WebP, at most 10 MB); finish with …/complete. */
export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  return NextResponse.json(await createPhotoUpload(actor, id, await readJson(req, photoCreateSchema)), { status: 201 });
});
