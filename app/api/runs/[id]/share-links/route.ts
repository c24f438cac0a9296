import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { createShareLink, listShareLinks } from "@/lib/share/share-links";
import { idSchema } from "@/lib/validations/crew";
import { createShareLinkSchema } from "@/lib/validations/share";

export const runtime = "nodejs";

/** The run's share links with views, expiry and revocation (leads). */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  return NextResponse.json({ shareLinks: await listShareLinks(actor, id) }, { headers: { "cache-control": "private, no-store" } });
});

/** `{expiresInDays}` → `{id, url, expiresAt}`; the URL carries the token and is shown this once. */
export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const input = await readJson(req, createShareLinkSchema);
  return NextResponse.json(await createShareLink(actor, id, input), { status: 201, headers: { "cache-control": "no-store" } });
});
