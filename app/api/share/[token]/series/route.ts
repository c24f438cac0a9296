import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, seriesQuerySchema } from "@/lib/series/query";
import { getSharedSeries } from "@/lib/share/shared-data";

export const runtime = "nodejs";

/** Chart data of the link's one run, exactly as `/api/runs/{id}/series` answers it. No session: the token is the key. */
export const GET = apiRoute<{ token: string }>(async (req, ctx) => {
  const { token } = parseParams(ctx.params, z.object({ token: z.string() }));
  const query = parseQuery(req.url, seriesQuerySchema);
  return cachedJson(await getSharedSeries(token, query, req.headers.get("if-none-match")));
});
