import { z } from "zod";
import { apiRoute } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { runStatusesForUser } from "@/db/queries/run-list";

export const runtime = "nodejs";

const idsSchema = z
  .string()
  .max(2000)
  .transform((s) => s.split(",").filter(Boolean).map(Number))
  .pipe(z.array(z.number().int().positive()).max(100));

/** GET /api/runs/status?ids=1,2,3 — status and progress of runs the caller may see (others are left out). */
export const GET = apiRoute(async (req) => {
  const actor = await requireActor();
  const ids = idsSchema.parse(new URL(req.url).searchParams.get("ids") ?? "");
  return { runs: await runStatusesForUser(actor.user.id, ids) };
});
