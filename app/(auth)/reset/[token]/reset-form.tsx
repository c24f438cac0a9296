"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { resetPasswordAction } from "./actions";

export function ResetForm({ token }: { token: string }) {
  const [state, action] = useActionState(resetPasswordAction, idle);
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <Field name="password" label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." errors={state.errors?.password} required />
      <Field name="confirm" label="The same again" type="password" autoComplete="new-password" errors={state.errors?.confirm} required />
      <FormMessage state={state} />
      <SubmitButton pendingLabel="Saving…">Save the new password</SubmitButton>
    </form>
  );
}
