import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { originalDownloadUrl } from "@/lib/ingest/runs";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** Redirects to a short-lived signed link for the original file. */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return NextResponse.redirect(await originalDownloadUrl(actor, id), 302);
});
