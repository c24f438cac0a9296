import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { cachedJson } from "@/lib/series/http";
import { parseQuery, trackQuerySchema } from "@/lib/series/query";
import { getSharedTrack } from "@/lib/share/shared-data";

export const runtime = "nodejs";

/** The map's track of the link's one run, exactly as `/api/runs/{id}/track` answers it. No session: the token is the key. */
export const GET = apiRoute<{ token: string }>(async (req, ctx) => {
  const { token } = parseParams(ctx.params, z.object({ token: z.string() }));
  const query = parseQuery(req.url, trackQuerySchema);
  return cachedJson(await getSharedTrack(token, query, req.headers.get("if-none-match")));
});
