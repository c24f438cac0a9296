"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { sendJson } from "@/components/builds/api";

/** Retiring keeps the build and its runs; it only stops offering the build for new uploads. */
export function RetireButton({ buildId, retired }: { buildId: number; retired: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div>
      <button
        type="button"
        className={retired ? "btn-quiet" : "btn-danger"}
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await sendJson(`/api/builds/${buildId}/retire`, "POST", { retired: !retired });
            router.refresh();
          } catch (e) {
            setError((e as Error).message);
          } finally {
            setBusy(false);
          }
        }}
      >
        {busy ? "Saving…" : retired ? "Bring back into service" : "Retire this build"}
      </button>
      {error && (
        <p className="field-error" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}
