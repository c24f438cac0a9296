import { z } from "zod";
import { listMembers } from "@/db/queries/crews";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { idSchema } from "@/lib/validations/crew";

export const GET = apiRoute<{ crewId: string }>(async (_req, { params }) => {
  const actor = await requireActor();
  const { crewId } = parseParams(params, z.object({ crewId: idSchema }));
  await requireCrewPermission(actor, crewId, "read", "Crew");
  return { members: await listMembers(crewId) };
});
