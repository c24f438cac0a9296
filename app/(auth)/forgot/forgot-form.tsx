"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { forgotPasswordAction } from "./actions";

export function ForgotForm() {
  const [state, action] = useActionState(forgotPasswordAction, idle);
  return (
    <form action={action} className="mt-6 space-y-4" noValidate>
      <Field name="email" label="E-mail" type="email" autoComplete="email" defaultValue={state.values?.email} errors={state.errors?.email} required />
      <FormMessage state={state} />
      <SubmitButton pendingLabel="Sending…">Send the link</SubmitButton>
    </form>
  );
}
