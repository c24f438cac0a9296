"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { apiJson } from "./put-with-progress";

export function ReparseButton({ runId, label = "Re-parse the original" }: { runId: number; label?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div>
      <button
        type="button"
        className="btn-quiet"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await apiJson(`/api/runs/${runId}/reparse`, { method: "POST", body: {} });
            router.refresh();
          } catch (e) {
            setError((e as Error).message);
          } finally {
            setBusy(false);
          }
        }}
      >
        {busy ? "Starting…" : label}
      </button>
      {error && <p className="field-error">{error}</p>}
    </div>
  );
}
