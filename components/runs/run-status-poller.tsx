"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { ProgressBar } from "./progress-bar";

/** While a run is queued or parsing, polls its status and refreshes the page when it settles. */
export function RunStatusPoller({ runId, status, progress }: { runId: number; status: string; progress: number }) {
  const router = useRouter();
  const [live, setLive] = useState({ status, progress });
  const active = live.status === "queued" || live.status === "parsing" || live.status === "analysing";

  useEffect(() => setLive({ status, progress }), [status, progress]);
  useEffect(() => {
    if (!active) return;
    const t = setInterval(async () => {
      const res = await fetch(`/api/runs/${runId}`, { cache: "no-store" });
      if (!res.ok) return;
      const { run } = (await res.json()) as { run: { status: string; progress: number } };
      setLive({ status: run.status, progress: run.progress });
      if (run.status === "ready" || run.status === "failed") router.refresh();
    }, 600);
    return () => clearInterval(t);
  }, [active, runId, router]);

  if (!active) return null;
  return (
    <div className="panel mb-6">
      <ProgressBar label={live.status === "queued" ? "Waiting for its turn" : "Reading the log"} value={live.progress} tone="signal" />
    </div>
  );
}
