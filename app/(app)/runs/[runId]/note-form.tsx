"use client";

import { useActionState, useEffect, useRef } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { addNoteAction } from "./actions";

export function NoteForm({ runId }: { runId: number }) {
  const [state, action] = useActionState(addNoteAction, idle);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.status === "ok") form.current?.reset();
  }, [state]);
  return (
    <form ref={form} action={action} className="mt-3 grid gap-2" noValidate>
      <input type="hidden" name="runId" value={runId} />
      <label htmlFor="note-body" className="field-label">
        Add a note
      </label>
      <textarea
        id="note-body"
        name="body"
        rows={3}
        maxLength={4000}
        className="field-input"
        placeholder="What happened, what you changed, what to check next time"
        aria-invalid={state.errors?.body ? true : undefined}
        aria-describedby={state.errors?.body ? "note-body-error" : undefined}
        defaultValue={state.status === "error" ? state.values?.body : undefined}
      />
      {state.errors?.body && (
        <p id="note-body-error" className="field-error">
          {state.errors.body[0]}
        </p>
      )}
      <div className="flex items-center gap-3">
        <SubmitButton pendingLabel="Saving…" className="btn-quiet">
          Add note
        </SubmitButton>
        <FormMessage state={state} />
      </div>
    </form>
  );
}
