import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { crewForNewRecord } from "@/lib/crews/resolve-crew";
import { listColumnMaps, saveColumnMap } from "@/lib/ingest/column-maps";
import { idSchema } from "@/lib/validations/crew";
import { columnMapCreateSchema } from "@/lib/validations/upload";

export const GET = apiRoute(async (req) => {
  const actor = await requireActor();
  const q = z.object({ crewId: idSchema.optional() }).parse(Object.fromEntries(new URL(req.url).searchParams));
  return { columnMaps: await listColumnMaps(actor, await crewForNewRecord(actor, q.crewId)) };
});

export const POST = apiRoute(async (req) => {
  const actor = await requireActor();
  const { crewId: requested, name, mapping } = await readJson(req, columnMapCreateSchema);
  const id = await saveColumnMap(actor, await crewForNewRecord(actor, requested), name, mapping);
  return NextResponse.json({ id }, { status: 201 });
});
