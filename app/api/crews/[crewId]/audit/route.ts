import { z } from "zod";
import { listAuditPage, readAuditQuery } from "@/db/queries/audit";
import { apiRoute, parseParams } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { idSchema } from "@/lib/validations/crew";

/** The crew's audit log, newest first, 50 a page (?page=, ?action=); leads only (ASVS V7.3.3). */
export const GET = apiRoute<{ crewId: string }>(async (req, { params }) => {
  const actor = await requireActor();
  const { crewId } = parseParams(params, z.object({ crewId: idSchema }));
  await requireCrewPermission(actor, crewId, "manageMembers", "Crew");
  const q = readAuditQuery(Object.fromEntries(new URL(req.url).searchParams));
  return listAuditPage(crewId, q);
});
