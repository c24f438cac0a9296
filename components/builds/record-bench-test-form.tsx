"use client";

import { useActionState } from "react";
import { recordBenchTestAction } from "@/app/(app)/builds/actions";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";

export interface RecordBenchTestFormProps {
  runId: number;
  buildId: number;
  buildName: string;
}

/**
 * "Record as the failsafe bench test of <build>": one button and an optional note, through the
 * server action (which checks the role, the run and the build again).
 */
export function RecordBenchTestForm({ runId, buildId, buildName }: RecordBenchTestFormProps) {
  const [state, action] = useActionState(recordBenchTestAction, idle);
  const noteError = state.errors?.note?.join(" ");
  return (
    <form action={action} className="grid gap-2" noValidate data-testid="record-bench-test">
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="buildId" value={buildId} />
      <label htmlFor="bench-note" className="field-label">
        Note for the build record <span className="font-normal text-ink-soft">(optional)</span>
      </label>
      <input
        id="bench-note"
        name="note"
        maxLength={500}
        className="field-input"
        placeholder="e.g. on the stand, transmitter off for 10 s"
        aria-invalid={noteError ? true : undefined}
        aria-describedby={noteError ? "bench-note-error" : undefined}
        defaultValue={state.status === "error" ? state.values?.note : undefined}
      />
      {noteError && (
        <p id="bench-note-error" className="field-error">
          {noteError}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-3">
        <SubmitButton pendingLabel="Recording…">Record as the failsafe bench test of {buildName}</SubmitButton>
        <FormMessage state={state} />
      </div>
    </form>
  );
}
