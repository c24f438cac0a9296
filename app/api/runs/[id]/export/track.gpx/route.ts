import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { exportTrackGpx, exportResponse } from "@/lib/exports/export-run";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** The flown track as a GPX 1.1 download, streamed from the stored samples. */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return exportResponse(await exportTrackGpx(actor, id));
});
