import { NextResponse } from "next/server";
import { z } from "zod";
import { listBuilds } from "@/db/queries/builds";
import { apiRoute, readJson } from "@/lib/api/handler";
import { requireCrewPermission } from "@/lib/auth/access";
import { requireActor } from "@/lib/auth/actor";
import { createBuild } from "@/lib/builds/create-build";
import { crewForNewRecord } from "@/lib/crews/resolve-crew";
import { buildCreateSchema } from "@/lib/validations/build";
import { idSchema } from "@/lib/validations/crew";

export const GET = apiRoute(async (req) => {
  const actor = await requireActor();
  const q = z.object({ crewId: idSchema.optional() }).parse(Object.fromEntries(new URL(req.url).searchParams));
  const crewId = await crewForNewRecord(actor, q.crewId);
  await requireCrewPermission(actor, crewId, "read", "Crew");
  return { builds: await listBuilds(crewId) };
});

export const POST = apiRoute(async (req) => {
  const actor = await requireActor();
  const { crewId: requested, ...input } = await readJson(req, buildCreateSchema);
  const crewId = await crewForNewRecord(actor, requested);
  const id = await createBuild(actor, crewId, input);
  return NextResponse.json({ id }, { status: 201 });
});
