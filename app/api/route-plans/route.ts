import { NextResponse } from "next/server";
import { z } from "zod";
import { listRoutePlans } from "@/db/queries/route-plans";
import { apiRoute, parseBody, readJson } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { crewForNewRecord } from "@/lib/crews/resolve-crew";
import { createRoutePlan } from "@/lib/route-plans/create-route-plan";
import { idSchema } from "@/lib/validations/crew";
import { routePlanCreateSchema, routePlanFromUploadSchema } from "@/lib/validations/route-plan";
import { routePlanFromUpload } from "@/lib/route-plans/route-plan-from-upload";

export const GET = apiRoute(async (req) => {
  const actor = await requireActor();
  const q = z.object({ crewId: idSchema.optional() }).parse(Object.fromEntries(new URL(req.url).searchParams));
  const crewId = await crewForNewRecord(actor, q.crewId);
  await requireCrewPermission(actor, crewId, "read", "Crew");
  return { routePlans: await listRoutePlans(crewId) };
});

/** JSON waypoints, or `{uploadId}` naming an uploaded GPX file with a route or waypoints. */
export const POST = apiRoute(async (req) => {
  const actor = await requireActor();
  const raw = await readJson(req, z.record(z.string(), z.unknown()));
  if ("uploadId" in raw) {
    const { uploadId, ...opts } = parseBody(raw, routePlanFromUploadSchema);
    return NextResponse.json({ id: await routePlanFromUpload(actor, uploadId, opts) }, { status: 201 });
  }
  const { crewId: requested, ...input } = parseBody(raw, routePlanCreateSchema);
  const crewId = await crewForNewRecord(actor, requested);
  const id = await createRoutePlan(actor, crewId, input, "json");
  return NextResponse.json({ id }, { status: 201 });
});
