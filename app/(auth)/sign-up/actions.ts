"use server";

import { headers } from "next/headers";
import { signUp } from "@/lib/accounts/sign-up";
import type { FormState } from "@/lib/actions/form-state";
import { runPublicAction } from "@/lib/actions/run-action";
import { clientIp } from "@/lib/auth/rate-limit";
import { signUpSchema } from "@/lib/validations/auth";

export async function signUpAction(_prev: FormState<{ email: string }>, form: FormData): Promise<FormState<{ email: string }>> {
  return runPublicAction(form, signUpSchema, async (data) => {
    await signUp(data, clientIp(await headers()));
    return { status: "ok", message: "Crew created. Signing you in…", result: { email: data.email } };
  });
}
