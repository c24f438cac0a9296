import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, trackQuerySchema } from "@/lib/series/query";
import { getRunTrack } from "@/lib/series/read-series";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** The map's track overview, worst link per bucket (TrackResponse). */
export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const query = parseQuery(req.url, trackQuerySchema);
  return cachedJson(await getRunTrack(actor, id, query, req.headers.get("if-none-match")));
});
