"use server";

import { revalidatePath } from "next/cache";
import type { FormState } from "@/lib/actions/form-state";
import { runAction } from "@/lib/actions/run-action";
import { addNote, setSignOff } from "@/lib/runs/notes";
import { noteSchema, signOffSchema } from "@/lib/validations/run-notes";

export async function addNoteAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, noteSchema, async (actor, { runId, body }) => {
    await addNote(actor, runId, body);
    revalidatePath(`/runs/${runId}`);
    return { status: "ok", message: "Note added." };
  });
}

export async function signOffAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, signOffSchema, async (actor, { runId, intent }) => {
    await setSignOff(actor, runId, intent);
    revalidatePath(`/runs/${runId}`);
    return { status: "ok", message: intent === "sign" ? "Signed off." : "Sign-off withdrawn." };
  });
}
