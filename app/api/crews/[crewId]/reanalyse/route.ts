import { z } from "zod";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { reanalyseCrewRuns } from "@/lib/crews/thresholds";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

export const POST = apiRoute<{ crewId: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { crewId } = parseParams(ctx.params, z.object({ crewId: idSchema }));
  return { queued: await reanalyseCrewRuns(actor, crewId) };
});
