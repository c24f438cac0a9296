import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, pointsQuerySchema } from "@/lib/series/query";
import { getSharedPoints } from "@/lib/share/shared-data";

export const runtime = "nodejs";

/** Scatter samples of the link's one run, exactly as `/api/runs/{id}/points` answers them. No session: the token is the key. */
export const GET = apiRoute<{ token: string }>(async (req, ctx) => {
  const { token } = parseParams(ctx.params, z.object({ token: z.string() }));
  const query = parseQuery(req.url, pointsQuerySchema);
  return cachedJson(await getSharedPoints(token, query, req.headers.get("if-none-match")));
});
