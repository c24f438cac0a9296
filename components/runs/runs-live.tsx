"use client";

import { useRouter } from "next/navigation";
import { useEffect } from "react";

const POLL_MS = 1500;

/**
 * Keeps a server-rendered runs table current while some of its runs are still being read:
 * polls their status and refreshes the page (keeping the URL's filters) when one changes.
 */
export function RunsLive({ active }: { active: { id: number; status: string }[] }) {
  const router = useRouter();
  const key = active.map((r) => `${r.id}:${r.status}`).join(",");
  useEffect(() => {
    if (!key) return;
    const known = new Map(key.split(",").map((p) => p.split(":") as [string, string]));
    let stopped = false;
    const t = setInterval(async () => {
      const res = await fetch(`/api/runs/status?ids=${[...known.keys()].join(",")}`, { cache: "no-store" }).catch(() => null);
      if (!res?.ok || stopped) return;
      const { runs } = (await res.json()) as { runs: { id: number; status: string }[] };
      if (runs.some((r) => known.get(String(r.id)) !== r.status)) {
        stopped = true;
        router.refresh();
      }
    }, POLL_MS);
    return () => {
      stopped = true;
      clearInterval(t);
    };
  }, [key, router]);
  return null;
}
