import { z } from "zod";
import { getBuild } from "@/db/queries/builds";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireRecordPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { updateBuild } from "@/lib/builds/update-build";
import { buildUpdateSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

const params = z.object({ id: idSchema });

export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  const { record } = await requireRecordPermission(actor, () => getBuild(id), "read", "Build");
  return { build: record };
});

/**
 * Partial update: the fields sent change, null clears one; every change lands in the history. A
 * change the analysis reads queues the build's ready runs again (`reanalysing` says how many).
 */
export const PUT = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  const { changed, reanalysing } = await updateBuild(actor, id, await readJson(req, buildUpdateSchema));
  return { build: await getBuild(id), changed, reanalysing };
});
