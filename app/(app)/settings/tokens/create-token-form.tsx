"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/form-state";
import { createApiTokenAction } from "../actions";

export function CreateTokenForm() {
  const [state, action] = useActionState(createApiTokenAction, { status: "idle" } as FormState<{ token: string }>);
  return (
    <form action={action} className="space-y-4" noValidate>
      <div className="grid gap-4 sm:grid-cols-[1fr_auto] sm:items-end">
        <Field name="name" label="Token name" placeholder="e.g. field laptop" errors={state.errors?.name} required />
        <SubmitButton pendingLabel="Creating…">Create token</SubmitButton>
      </div>
      <FormMessage state={state} />
      {state.result?.token && (
        <div className="rounded-md border border-tide-500 bg-tide-50 p-3">
          <label htmlFor="new-token" className="field-label">
            Your new token
          </label>
          <input id="new-token" readOnly value={state.result.token} className="field-input figures" onFocus={(e) => e.currentTarget.select()} />
          <p className="mt-2 text-sm text-ink-soft">
            Send it as <code className="figures">Authorization: Bearer …</code> with each API request.
          </p>
        </div>
      )}
    </form>
  );
}
