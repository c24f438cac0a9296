import { pool } from "@/db/client";

/**
 * A cached answer to "is MariaDB up?" for proxy.ts, so a page request during an outage gets a
 * plain 503 page instead of a render that fails part-way. At most one probe is in flight and an
 * answer is reused for 250 ms, so a busy instance sends a few `SELECT 1` a second, not one per page.
 */
const HEALTHY_FOR_MS = 250;
const UNHEALTHY_FOR_MS = 250;
const PROBE_TIMEOUT_MS = 1_500;

interface ProbeState {
  ok: boolean;
  at: number;
  inflight: Promise<boolean> | null;
}

const g = globalThis as unknown as { sortieDbProbe?: ProbeState };

async function probe(): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => (timer = setTimeout(() => resolve(false), PROBE_TIMEOUT_MS)));
  const ping = pool()
    .query("SELECT 1")
    .then(() => true, () => false);
  try {
    return await Promise.race([ping, timeout]);
  } finally {
    clearTimeout(timer);
  }
}

export async function databaseAnswering(now = Date.now()): Promise<boolean> {
  const s = (g.sortieDbProbe ??= { ok: true, at: 0, inflight: null });
  const fresh = now - s.at < (s.ok ? HEALTHY_FOR_MS : UNHEALTHY_FOR_MS);
  if (fresh) return s.ok;
  s.inflight ??= probe().then((ok) => {
    s.ok = ok;
    s.at = Date.now();
    s.inflight = null;
    return ok;
  });
  return s.inflight;
}
