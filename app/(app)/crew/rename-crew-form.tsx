"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { renameCrewAction } from "./actions";

export function RenameCrewForm({ crewId, name }: { crewId: number; name: string }) {
  const [state, action] = useActionState(renameCrewAction, idle);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-[1fr_auto] sm:items-end" noValidate>
      <input type="hidden" name="crewId" value={crewId} />
      <Field name="name" label="Crew name" defaultValue={name} errors={state.errors?.name} required id="crew-name" />
      <SubmitButton pendingLabel="Saving…" className="btn-quiet">
        Rename
      </SubmitButton>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
      </div>
    </form>
  );
}
