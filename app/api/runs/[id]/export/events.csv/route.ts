import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { exportEventsCsv, exportResponse } from "@/lib/exports/export-run";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** The run's events as a CSV download, cells defused against formula injection. */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return exportResponse(await exportEventsCsv(actor, id));
});
