"use client";

import { useActionState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SelectField } from "@/components/ui/select-field";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { createBuildAction } from "./actions";

export function CreateBuildForm({ crewId }: { crewId: number }) {
  const [state, action] = useActionState(createBuildAction, idle);
  const e = state.errors ?? {};
  return (
    <form action={action} className="grid gap-4 sm:grid-cols-2" noValidate key={state.status === "ok" ? state.message : "form"}>
      <input type="hidden" name="crewId" value={crewId} />
      <Field name="name" label="Name" placeholder="e.g. Rover 2" errors={e.name} required />
      <SelectField
        name="vehicleType"
        label="Vehicle type"
        errors={e.vehicleType}
        options={[
          { value: "ground", label: "Ground rover" },
          { value: "multirotor", label: "Multirotor" },
          { value: "fixed-wing", label: "Fixed-wing plane" },
          { value: "boat", label: "Boat" },
        ]}
      />
      <Field name="receiver" label="Receiver" errors={e.receiver} />
      <Field name="bandMhz" label="Link band (MHz)" inputMode="decimal" placeholder="e.g. 868" errors={e.bandMhz} />
      <Field name="rxSensitivityDbm" label="Receiver sensitivity (dBm)" inputMode="decimal" placeholder="e.g. -105" errors={e.rxSensitivityDbm} />
      <Field name="batteryCells" label="Battery cells (S)" inputMode="numeric" errors={e.batteryCells} />
      <SelectField
        name="failsafeAction"
        label="Failsafe plan"
        errors={e.failsafeAction}
        options={[
          { value: "", label: "Not set yet" },
          { value: "return-to-home", label: "Return to home" },
          { value: "hold", label: "Hold position" },
          { value: "land", label: "Land" },
        ]}
      />
      <div className="sm:col-span-2">
        <FormMessage state={state} />
        <SubmitButton pendingLabel="Saving…">Record build</SubmitButton>
      </div>
    </form>
  );
}
