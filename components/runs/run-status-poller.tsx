"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { ProgressBar } from "./progress-bar";

/** While a run is queued or parsing, polls its status and refreshes the page when it settles. */
export function RunStatusPoller({ runId, status, progress, error }: { runId: number; status: string; progress: number; error?: string | null }) {
  const router = useRouter();
  const [live, setLive] = useState<{ status: string; progress: number; error?: string | null }>({ status, progress, error });
  const active = live.status === "queued" || live.status === "parsing" || live.status === "analysing";

  useEffect(() => setLive({ status, progress, error }), [status, progress, error]);
  useEffect(() => {
    if (!active) return;
    const t = setInterval(async () => {
      const res = await fetch(`/api/runs/${runId}`, { cache: "no-store" });
      if (!res.ok) return;
      const { run } = (await res.json()) as { run: { status: string; progress: number; error: string | null } };
      setLive({ status: run.status, progress: run.progress, error: run.error });
      if (run.status === "ready" || run.status === "failed") router.refresh();
    }, 600);
    return () => clearInterval(t);
  }, [active, runId, router]);

  if (!active) return null;
  return (
    <div className="panel mb-6">
      <ProgressBar
        label={live.status !== "queued" ? "Reading the log" : live.error ? "Waiting to try again" : "Waiting for its turn"}
        value={live.progress}
        tone="signal"
      />
      {/* A queued run with an error is waiting out a passing fault (lib/jobs/worker.ts). */}
      {live.status === "queued" && live.error && (
        <p className="mt-2 text-sm text-ink-soft" role="status">
          {live.error}
        </p>
      )}
    </div>
  );
}
