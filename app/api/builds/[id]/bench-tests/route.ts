import { NextResponse } from "next/server";
import { z } from "zod";
import { apiRoute, parseParams, readJson } from "@/lib/api/handler";
import { requireActor } from "@/lib/auth/actor";
import { listBenchTests, recordBenchTest } from "@/lib/builds/bench-tests";
import { benchTestCreateSchema } from "@/lib/validations/bench-test";
import { idSchema } from "@/lib/validations/crew";

export const runtime = "nodejs";

const params = z.object({ id: idSchema });

/** The build's failsafe bench tests, latest first, each with `stale` (the link sheet changed after it). */
export const GET = apiRoute<{ id: string }>(async (_req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  return listBenchTests(actor, id);
});

/** Records a bench run of this build as its failsafe bench test: 201 when new, 200 when it already was. */
export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const actor = await requireActor();
  const { id } = parseParams(ctx.params, params);
  const { runId, note } = await readJson(req, benchTestCreateSchema);
  const out = await recordBenchTest(actor, runId, { buildId: id, note });
  return NextResponse.json(out, { status: out.created ? 201 : 200 });
});
