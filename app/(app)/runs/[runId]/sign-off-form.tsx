"use client";

import { useActionState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import { idle } from "@/lib/actions/form-state";
import { signOffAction } from "./actions";

export function SignOffForm({ runId, signed }: { runId: number; signed: boolean }) {
  const [state, action] = useActionState(signOffAction, idle);
  return (
    <form action={action} className="flex flex-wrap items-center gap-3">
      <input type="hidden" name="runId" value={runId} />
      <input type="hidden" name="intent" value={signed ? "withdraw" : "sign"} />
      <SubmitButton pendingLabel="Saving…" className={signed ? "btn-quiet" : "btn-primary"}>
        {signed ? "Withdraw sign-off" : "Sign off this debrief"}
      </SubmitButton>
      <FormMessage state={state} />
    </form>
  );
}
