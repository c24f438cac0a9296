import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, pointsQuerySchema } from "@/lib/series/query";
import { getRunPoints } from "@/lib/series/read-series";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** Actual samples where every requested field has a value, for scatter plots (PointsResponse). */
export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const query = parseQuery(req.url, pointsQuerySchema);
  return cachedJson(await getRunPoints(actor, id, query, req.headers.get("if-none-match")));
});
