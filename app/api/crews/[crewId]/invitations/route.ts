import { NextResponse } from "next/server";
import { z } from "zod";
import { listPendingInvitations } from "@/db/queries/crews";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { inviteMember } from "@/lib/crews/invitations";
import { idSchema, inviteMemberSchema } from "@/lib/validations/crew";

const params = z.object({ crewId: idSchema });

export const GET = apiRoute<{ crewId: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { crewId } = parseParams(ctx.params, params);
  await requireCrewPermission(actor, crewId, "manageMembers", "Crew");
  return { invitations: await listPendingInvitations(crewId) };
});

export const POST = apiRoute<{ crewId: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { crewId } = parseParams(ctx.params, params);
  const input = await readJson(req, inviteMemberSchema);
  const result = await inviteMember(actor, crewId, input);
  return NextResponse.json(result, { status: 201 });
});
