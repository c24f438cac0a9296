"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { FormState } from "@/lib/actions/form-state";
import { runAction } from "@/lib/actions/run-action";
import { createBuild } from "@/lib/builds/create-build";
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
