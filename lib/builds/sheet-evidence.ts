/**
 * Gathers what a build's logs say for the sheet check's evidence rules: each recent run's failsafe
 * result (runs.summary) and facts about its RC channels from a stride sample of its stored rows.
 */
import { and, desc, eq, sql } from "drizzle-orm";
import { db, pool } from "@/db/client";
import { runs } from "@/db/schema";
import { decodeRc } from "@/lib/ingest/sample-tsv";
import { summariseRc } from "./rc-facts";
import type { RunEvidence } from "./sheet-check";

/** At most this many rows are read per run (an even stride over its seq), never all of a long log. */
export const EVIDENCE_ROWS_PER_RUN = 20_000;
/** Only the latest runs speak for the build as it is now. Our choice. */
export const EVIDENCE_MAX_RUNS = 10;
/** seqs per query: keeps each statement's parameter list modest. */
const SEQ_CHUNK = 5_000;

/** The seqs of an even stride through 0…n−1, at most `max` of them. */
export function strideSeqs(n: number, max = EVIDENCE_ROWS_PER_RUN): number[] {
  if (n <= 0) return [];
  const stride = Math.max(1, Math.ceil(n / max));
  const out: number[] = [];
  for (let s = 0; s < n; s += stride) out.push(s);
  return out;
}

/** Decoded RC rows of a run at the stride seqs, by primary-key lookups. */
async function sampledRc(runId: number, sampleCount: number): Promise<number[][]> {
  const seqs = strideSeqs(sampleCount);
  const rows: number[][] = [];
  for (let i = 0; i < seqs.length; i += SEQ_CHUNK) {
    const [res] = await pool().query({
      sql: "SELECT rc FROM samples WHERE run_id = ? AND seq IN (?) AND rc IS NOT NULL",
      values: [runId, seqs.slice(i, i + SEQ_CHUNK)],
      rowsAsArray: true,
    });
    for (const [rc] of res as [Buffer | null][]) {
      const decoded = decodeRc(rc);
      if (decoded) rows.push(decoded);
    }
  }
  return rows;
}

interface SummaryBits {
  hasRc?: boolean;
  failsafe?: { result?: string | null; action?: string | null; plan?: { action?: string } | null } | null;
}

/** Evidence from the build's latest ready runs (newest first). The caller has checked access. */
export async function gatherSheetEvidence(build: { id: number; crewId: number }): Promise<RunEvidence[]> {
  const rows = await db()
    .select({ id: runs.id, title: runs.title, summary: runs.summary, sampleCount: runs.sampleCount })
    .from(runs)
    .where(and(eq(runs.crewId, build.crewId), eq(runs.buildId, build.id), eq(runs.status, "ready")))
    .orderBy(desc(sql`COALESCE(${runs.startedAt}, ${runs.createdAt})`), desc(runs.id))
    .limit(EVIDENCE_MAX_RUNS);
  const out: RunEvidence[] = [];
  for (const r of rows) {
    const s = (r.summary ?? {}) as SummaryBits;
    const fs = s.failsafe;
    out.push({
      runId: r.id,
      title: r.title,
      failsafe: fs ? { result: fs.result ?? null, action: fs.action ?? null, planAction: fs.plan?.action ?? null } : null,
      rc: s.hasRc && r.sampleCount > 0 ? summariseRc(await sampledRc(r.id, r.sampleCount)) : null,
    });
  }
  return out;
}
