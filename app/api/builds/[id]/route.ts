import { z } from "zod";
import { getBuild } from "@/db/queries/builds";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireRecordPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { idSchema } from "@/lib/validations/crew";

export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, z.object({ id: idSchema }));
  const { record } = await requireRecordPermission(actor, () => getBuild(id), "read", "Build");
  return { build: record };
});
