"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SelectField } from "@/components/ui/select-field";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { updateProfileAction } from "./actions";

export function ProfileForm({ user }: { user: { name: string; units: string; alertEmails: boolean } }) {
  const [state, action] = useActionState(updateProfileAction, idle);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate>
      <Field name="name" label="Name" defaultValue={user.name} errors={state.errors?.name} required />
      <SelectField
        name="units"
        label="Units"
        defaultValue={user.units}
        options={[
          { value: "metric", label: "Metric (m, km/h)" },
          { value: "imperial", label: "Imperial (ft, mph)" },
        ]}
      />
      <label className="flex min-h-11 items-center gap-3 sm:col-span-2">
        <input type="checkbox" name="alertEmails" defaultChecked={user.alertEmails} className="h-5 w-5 accent-tide-700" />
        <span>E-mail me when a run of my crews gets the verdict “act”</span>
      </label>
      <div className="sm:col-span-2">
        <FormMessage state={state} />
        <SubmitButton pendingLabel="Saving…">Save</SubmitButton>
      </div>
    </form>
  );
}
