"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { createCrewAction } from "./actions";

export function CreateCrewForm() {
  const [state, action] = useActionState(createCrewAction, idle);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-[1fr_auto] sm:items-end" noValidate>
      <Field name="name" label="Crew name" errors={state.errors?.name} required />
      <SubmitButton pendingLabel="Creating…" className="btn-quiet">
        Start crew
      </SubmitButton>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
    </form>
  );
}
