"use server";

import { redirect } from "next/navigation";
import { resetPassword } from "@/lib/accounts/password-reset";
import type { FormState } from "@/lib/actions/form-state";
import { runPublicAction } from "@/lib/actions/run-action";
import { resetPasswordSchema } from "@/lib/validations/auth";

export async function resetPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  const state = await runPublicAction(form, resetPasswordSchema, async ({ token, password }) => {
    await resetPassword(token, password);
  });
  // redirect() throws, so it stays outside the error mapping.
  if (state.status === "ok") redirect("/sign-in?reset=1");
  return state;
}
