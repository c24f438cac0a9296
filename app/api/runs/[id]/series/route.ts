import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, seriesQuerySchema } from "@/lib/series/query";
import { getRunSeries } from "@/lib/series/read-series";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

/** Chart data: min/max envelopes of the requested fields over a time range (SeriesResponse). */
export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const query = parseQuery(req.url, seriesQuerySchema);
  return cachedJson(await getRunSeries(actor, id, query, req.headers.get("if-none-match")));
});
