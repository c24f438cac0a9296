"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SelectField } from "@/components/ui/select-field";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { inviteMemberAction } from "./actions";

export const roleOptions = [
  { value: "pilot", label: "Pilot — uploads logs, writes notes" },
  { value: "observer", label: "Observer — reads only" },
  { value: "lead", label: "Lead — manages crew, builds, sign-off" },
];

export function InviteForm({ crewId }: { crewId: number }) {
  const [state, action] = useActionState(inviteMemberAction, idle);
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-[2fr_2fr_auto] sm:items-end" noValidate>
      <input type="hidden" name="crewId" value={crewId} />
      <Field name="email" label="E-mail" type="email" autoComplete="off" defaultValue={state.status === "error" ? state.values?.email : ""} errors={state.errors?.email} required />
      <SelectField name="role" label="Role" options={roleOptions} errors={state.errors?.role} />
      <SubmitButton pendingLabel="Sending…">Send invitation</SubmitButton>
      <div className="sm:col-span-3">
        <FormMessage state={state} />
      </div>
    </form>
  );
}
