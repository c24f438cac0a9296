import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { getCrewThresholds, setCrewThresholds } from "@/lib/crews/thresholds";
import { idSchema } from "@/lib/validations/crew";
import { thresholdsSchema } from "@/lib/validations/thresholds";

const params = z.object({ crewId: idSchema });

export const GET = apiRoute<{ crewId: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { crewId } = parseParams(ctx.params, params);
  return { thresholds: await getCrewThresholds(actor, crewId) };
});

export const PUT = apiRoute<{ crewId: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { crewId } = parseParams(ctx.params, params);
  const overrides = await readJson(req, thresholdsSchema);
  await setCrewThresholds(actor, crewId, overrides);
  return { thresholds: overrides };
});
