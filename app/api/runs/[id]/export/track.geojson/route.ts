import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { exportTrackGeoJson, exportResponse } from "@/lib/exports/export-run";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** The flown track as a GeoJSON (RFC 7946) download, streamed from the stored samples. */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return exportResponse(await exportTrackGeoJson(actor, id));
});
