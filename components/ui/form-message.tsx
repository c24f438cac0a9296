import type { FormState } from "@/lib/actions/form-state";

/** The form-level outcome, announced to screen readers. */
export function FormMessage({ state }: { state: Pick<FormState<unknown>, "status" | "message"> }) {
  return (
    <div aria-live="polite" role="status" className="min-h-5">
      {state.message && (
        <p className={`rounded-md px-3 py-2 text-sm ${state.status === "error" ? "bg-act/10 text-act" : "bg-clear/10 text-clear"}`}>
          {state.message}
        </p>
      )}
    </div>
  );
}
