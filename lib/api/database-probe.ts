import mysql from "mysql2/promise";
import { isDatabaseDown } from "@/lib/api/database-down";
import { env } from "@/lib/env";

/**
 * A cached answer to "is MariaDB up?" for proxy.ts, so a page request during an outage gets a
 * plain 503 page instead of a render that fails part-way. The probe has a one-connection pool of
 * its own, so a busy app pool never looks like a dead database; only a connection-level failure
 * (or no answer in time) counts as down. At most one probe is in flight and an answer is reused
 * for 250 ms, so a busy instance sends a few `SELECT 1` a second, not one per page.
 */
const FRESH_FOR_MS = 250;
const PROBE_TIMEOUT_MS = 2_000;

interface ProbeState {
  ok: boolean;
  at: number;
  inflight: Promise<boolean> | null;
  pool: mysql.Pool | null;
}

const g = globalThis as unknown as { sortieDbProbe?: ProbeState };

function probePool(s: ProbeState): mysql.Pool {
  return (s.pool ??= mysql.createPool({ uri: env().DATABASE_URL, connectionLimit: 1, connectTimeout: PROBE_TIMEOUT_MS, enableKeepAlive: true }));
}

async function probe(s: ProbeState): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<"timeout">((resolve) => (timer = setTimeout(() => resolve("timeout"), PROBE_TIMEOUT_MS)));
  const ping = probePool(s)
    .query("SELECT 1")
    .then(
      () => true,
      // A fatal error is a dead connection even when it carries no code ("connection is in closed state").
      (e: unknown) => !(isDatabaseDown(e) || (e as { fatal?: boolean }).fatal),
    );
  try {
    const answer = await Promise.race([ping, timeout]);
    if (answer !== "timeout") return answer;
    // A hung query holds the only connection: start over, or every later probe would queue behind it.
    const stale = s.pool;
    s.pool = null;
    stale?.end().catch(() => {});
    return false;
  } finally {
    clearTimeout(timer);
  }
}

export async function databaseAnswering(now = Date.now()): Promise<boolean> {
  const s = (g.sortieDbProbe ??= { ok: true, at: 0, inflight: null, pool: null });
  if (now - s.at < FRESH_FOR_MS) return s.ok;
  s.inflight ??= probe(s).then((ok) => {
    s.ok = ok;
    s.at = Date.now();
    s.inflight = null;
    return ok;
  });
  return s.inflight;
}
