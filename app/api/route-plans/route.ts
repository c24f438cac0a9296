import { NextResponse } from "next/server";
import { z } from "zod";
import { listRoutePlans } from "@/db/queries/route-plans";
import { apiRoute, readJson } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { crewForNewRecord } from "@/lib/crews/resolve-crew";
import { createRoutePlan } from "@/lib/route-plans/create-route-plan";
import { idSchema } from "@/lib/validations/crew";
import { routePlanCreateSchema } from "@/lib/validations/route-plan";

export const GET = apiRoute(async (req) => {
  const actor = await requireActor();
  const q = z.object({ crewId: idSchema.optional() }).parse(Object.fromEntries(new URL(req.url).searchParams));
  const crewId = await crewForNewRecord(actor, q.crewId);
  await requireCrewPermission(actor, crewId, "read", "Crew");
  return { routePlans: await listRoutePlans(crewId) };
});

export const POST = apiRoute(async (req) => {
  const actor = await requireActor();
  const { crewId: requested, ...input } = await readJson(req, routePlanCreateSchema);
  const crewId = await crewForNewRecord(actor, requested);
  const id = await createRoutePlan(actor, crewId, input, "json");
  return NextResponse.json({ id }, { status: 201 });
});
