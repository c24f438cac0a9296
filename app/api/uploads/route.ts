import { NextResponse } from "next/server";
import { apiRoute, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { crewForNewRecord } from "@/lib/crews/resolve-crew";
import { createUpload } from "@/lib/ingest/uploads";
import { uploadCreateSchema } from "@/lib/validations/upload";

export const runtime = "nodejs";

export const POST = apiRoute(async (req) => {
  const actor = await requireActor();
  const { crewId: requested, ...input } = await readJson(req, uploadCreateSchema);
  const crewId = await crewForNewRecord(actor, requested);
  return NextResponse.json(await createUpload(actor, crewId, input), { status: 201 });
});
