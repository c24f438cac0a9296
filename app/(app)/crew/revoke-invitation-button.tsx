"use client";

import { useActionState } from "react";
import { idle } from "@/lib/actions/form-state";
import { revokeInvitationAction } from "./actions";

export function RevokeInvitationButton({ invitationId }: { invitationId: number }) {
  const [state, action] = useActionState(revokeInvitationAction, idle);
  return (
    <form action={action}>
      <input type="hidden" name="invitationId" value={invitationId} />
      <button type="submit" className="btn-quiet">
        Withdraw
      </button>
      {state.status === "error" && <p className="field-error">{state.message}</p>}
    </form>
  );
}
