"use client";

import { useActionState } from "react";
import { idle } from "@/lib/actions/form-state";
import { revokeApiTokenAction } from "../actions";

export function RevokeTokenButton({ tokenId, name }: { tokenId: number; name: string }) {
  const [state, action] = useActionState(revokeApiTokenAction, idle);
  return (
    <form
      action={action}
      onSubmit={(e) => {
        if (!confirm(`Revoke “${name}”? Scripts using it stop working at once.`)) e.preventDefault();
      }}
    >
      <input type="hidden" name="tokenId" value={tokenId} />
      <button type="submit" className="btn-danger">
        Revoke
      </button>
      {state.status === "error" && <p className="field-error">{state.message}</p>}
    </form>
  );
}
