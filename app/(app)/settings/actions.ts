"use server";

import { revalidatePath } from "next/cache";
import { updateProfile } from "@/lib/accounts/profile";
import type { FormState } from "@/lib/actions/form-state";
import { runAction } from "@/lib/actions/run-action";
import { createApiToken, revokeApiToken } from "@/lib/api-tokens";
import { setActiveCrewCookie } from "@/lib/auth/active-crew";
import { createCrew } from "@/lib/crews/members";
import { createApiTokenSchema } from "@/lib/validations/api-token";
import { profileSchema } from "@/lib/validations/auth";
import { createCrewSchema, idSchema } from "@/lib/validations/crew";
import { z } from "zod";

export async function updateProfileAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, profileSchema, async (actor, data) => {
    await updateProfile(actor, data);
    revalidatePath("/", "layout");
    return { status: "ok", message: "Saved." };
  });
}

export async function createCrewAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, createCrewSchema, async (actor, { name }) => {
    const crewId = await createCrew(actor, name);
    await setActiveCrewCookie(crewId);
    revalidatePath("/", "layout");
    return { status: "ok", message: `Crew “${name}” created; you lead it and it is now your active crew.` };
  });
}

export async function createApiTokenAction(_prev: FormState<{ token: string }>, form: FormData): Promise<FormState<{ token: string }>> {
  return runAction(form, createApiTokenSchema, async (actor, { name }) => {
    const { token } = await createApiToken(actor, name);
    revalidatePath("/settings/tokens");
    return { status: "ok", message: "Copy the token now: it is shown only this once.", result: { token } };
  });
}

export async function revokeApiTokenAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runAction(form, z.object({ tokenId: idSchema }), async (actor, { tokenId }) => {
    await revokeApiToken(actor, tokenId);
    revalidatePath("/settings/tokens");
    return { status: "ok", message: "Token revoked." };
  });
}
