"use server";

import { requestPasswordReset } from "@/lib/accounts/password-reset";
import type { FormState } from "@/lib/actions/form-state";
import { runPublicAction } from "@/lib/actions/run-action";
import { forgotPasswordSchema } from "@/lib/validations/auth";

export async function forgotPasswordAction(_prev: FormState, form: FormData): Promise<FormState> {
  return runPublicAction(form, forgotPasswordSchema, async ({ email }) => {
    await requestPasswordReset(email);
    // Same answer whether or not the account exists.
    return { status: "ok", message: `If ${email} has a Sortie account, a reset link is on its way. It works for one hour.` };
  });
}
