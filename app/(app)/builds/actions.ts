"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/lib/actions/form-state";
import { runAction } from "@/lib/actions/run-action";
import { recordBenchTest } from "@/lib/builds/bench-tests";
import { createBuild } from "@/lib/builds/create-build";
import { benchTestFormSchema } from "@/lib/validations/bench-test";
import { buildCreateSchema } from "@/lib/validations/build";

const num = (v: unknown) => (v === "" || v == null ? undefined : Number(String(v).replace(",", ".")));

// The form sends strings; numbers are converted here, then the shared schema checks the ranges.
const buildFormSchema = z.preprocess((raw) => {
  const o = raw as Record<string, unknown>;
  return {
    ...o,
    bandMhz: num(o.bandMhz),
    rxSensitivityDbm: num(o.rxSensitivityDbm),
    batteryCells: num(o.batteryCells),
    failsafeAction: o.failsafeAction || undefined,
  };
}, buildCreateSchema.required({ crewId: true }));

export async function createBuildAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, buildFormSchema, async (actor, { crewId, ...input }) => {
    await createBuild(actor, crewId, input);
    revalidatePath("/builds");
    return { status: "ok", message: `Build “${input.name}” recorded.` };
  });
}

/** The debrief's "record as the failsafe bench test" button (leads; the server checks). */
export async function recordBenchTestAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, benchTestFormSchema, async (actor, { runId, buildId, note }) => {
    const { created } = await recordBenchTest(actor, runId, { buildId, note });
    revalidatePath(`/runs/${runId}`);
    revalidatePath(`/builds/${buildId}`);
    revalidatePath(`/builds/${buildId}/checklist`);
    return { status: "ok", message: created ? "Recorded as the build's failsafe bench test." : "This run was already recorded as the build's failsafe bench test." };
  });
}
