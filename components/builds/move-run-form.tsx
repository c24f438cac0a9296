"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { sendJson } from "./api";

export interface MoveRunFormProps {
  runId: number;
  currentBuildId: number | null;
  /** The crew's builds in service (listBuilds(crewId) in db/queries/builds.ts). */
  builds: { id: number; name: string }[];
}

/**
 * Attaches a run to another build of its crew (or to none) via PUT /api/runs/{id}/build; the run
 * is then analysed again with that build's failsafe plan and link sheet. For leads and the run's
 * pilot (the server checks).
 */
export function MoveRunForm({ runId, currentBuildId, builds }: MoveRunFormProps) {
  const router = useRouter();
  const [choice, setChoice] = useState(currentBuildId == null ? "" : String(currentBuildId));
  const [state, setState] = useState<{ busy: boolean; error: string | null; ok: string | null }>({ busy: false, error: null, ok: null });
  const unchanged = choice === (currentBuildId == null ? "" : String(currentBuildId));
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      data-testid="move-run-form"
      onSubmit={async (e) => {
        e.preventDefault();
        setState({ busy: true, error: null, ok: null });
        try {
          await sendJson(`/api/runs/${runId}/build`, "PUT", { buildId: choice ? Number(choice) : null });
          setState({ busy: false, error: null, ok: "Moved; the run is being analysed again with this build." });
          router.refresh();
        } catch (err) {
          setState({ busy: false, error: (err as Error).message, ok: null });
        }
      }}
    >
      <div>
        <label htmlFor={`move-run-${runId}`} className="field-label">
          Build
        </label>
        <select id={`move-run-${runId}`} className="field-input" value={choice} onChange={(e) => setChoice(e.target.value)}>
          <option value="">No build</option>
          {currentBuildId != null && !builds.some((b) => b.id === currentBuildId) && <option value={currentBuildId}>Current (retired) build</option>}
          {builds.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit" className="btn-quiet" disabled={state.busy || unchanged}>
        {state.busy ? "Moving…" : "Move and re-analyse"}
      </button>
      <p role="status" aria-live="polite" className="min-h-5 w-full text-sm">
        {state.error && <span className="text-act">{state.error}</span>}
        {state.ok && <span className="text-clear">{state.ok}</span>}
      </p>
    </form>
  );
}
