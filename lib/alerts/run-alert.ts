/**
 * E-mail alerts when a run's analysis says "act": every lead of the run's crew who has verdict
 * alerts on (users.alertEmails, in Settings) gets one mail, in their own units.
 *
 * Once per outcome, without a table of its own: each alert that went out is an audit entry
 * ("run.alert-sent", target the run). After an analysis that says "act":
 *   - the verdict before this analysis was not "act" (first parse, or a re-parse after clear or
 *     watch) → send: this is a new act outcome;
 *   - it was "act" already → send only if no alert was ever recorded for the run (the earlier one
 *     found no recipient, or every send failed); otherwise this re-parse repeats an outcome the
 *     leads already know about.
 * A send to a lead that fails is logged and skipped; the entry is written when at least one mail
 * went out. The ingest runs this inside its own transaction, so the decision, its audit entry and
 * its queued mail commit with the new figures or not at all; mail itself goes through the outbox,
 * so an SMTP outage only delays it.
 */
import { and, eq } from "drizzle-orm";
import { db, type Database } from "@/db/client";
import { auditLog, builds, crews, memberships, runs, users, type VerdictLevel } from "@/db/schema";
import type { RunSummary } from "@/components/debrief/figure-list";
import { errorCode, isDatabaseDown } from "@/lib/api/database-down";
import { audit } from "@/lib/audit";
import { env } from "@/lib/env";
import { runAlertMail } from "@/lib/mail/run-alert-mail";
import { queueMail } from "@/lib/mail/outbox";

export const ALERT_ACTION = "run.alert-sent";

export type AlertResult =
  | { sent: number; failed: number; recipients: number[] }
  | { skipped: "not-ready" | "not-act" | "already-sent" | "no-recipients" };

/**
 * The ingest hook, run inside the ingest transaction just before it commits, with the verdict the
 * run had before this analysis: the decision, its audit entry and its queued mail commit (or roll
 * back) with the new figures. Errors are logged, never thrown: an alert must not fail an ingest.
 */
export async function alertAfterAnalysis(runId: number, previousVerdict: VerdictLevel | null, dbx: Database = db()): Promise<void> {
  try {
    await sendRunAlert(runId, previousVerdict, dbx);
  } catch (e) {
    // A deadlock, lock timeout or lost connection has ended the ingest transaction itself: the
    // ingest must see it (and retry), not commit what is left as if the alert were the only loss.
    if (endsTransaction(e)) throw e;
    console.error(`[alerts] run ${runId}: ${(e as Error).message}`);
  }
}

function endsTransaction(e: unknown): boolean {
  return /^(ER_LOCK_DEADLOCK|ER_LOCK_WAIT_TIMEOUT)$/.test(String(errorCode(e))) || isDatabaseDown(e);
}



async function alreadyAlerted(runId: number, dbx: Database): Promise<boolean> {
  const [row] = await dbx
    .select({ id: auditLog.id })
    .from(auditLog)
    .where(and(eq(auditLog.action, ALERT_ACTION), eq(auditLog.targetType, "run"), eq(auditLog.targetId, String(runId))))
    .limit(1);
  return Boolean(row);
}

/** Leads of the crew who want verdict alerts. */
function alertedLeads(crewId: number, dbx: Database) {
  return dbx
    .select({ id: users.id, email: users.email, name: users.name, units: users.units })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.crewId, crewId), eq(memberships.role, "lead"), eq(users.alertEmails, true)));
}

/** Decides and queues (see the file comment). Exported for tests and scripts; the ingest uses alertAfterAnalysis. */
export async function sendRunAlert(runId: number, previousVerdict: VerdictLevel | null, dbx: Database = db()): Promise<AlertResult> {
  const [run] = await dbx.select().from(runs).where(eq(runs.id, runId)).limit(1);
  if (!run || run.status !== "ready") return { skipped: "not-ready" };
  if (run.verdict !== "act") return { skipped: "not-act" };
  if (previousVerdict === "act" && (await alreadyAlerted(runId, dbx))) return { skipped: "already-sent" };

  const leads = await alertedLeads(run.crewId, dbx);
  if (leads.length === 0) return { skipped: "no-recipients" };
  const [[crew], [build], [pilot]] = await Promise.all([
    dbx.select({ name: crews.name }).from(crews).where(eq(crews.id, run.crewId)).limit(1),
    run.buildId ? dbx.select({ name: builds.name }).from(builds).where(eq(builds.id, run.buildId)).limit(1) : Promise.resolve([]),
    run.pilotId ? dbx.select({ name: users.name }).from(users).where(eq(users.id, run.pilotId)).limit(1) : Promise.resolve([]),
  ]);
  const summary = (run.summary ?? {}) as RunSummary & { verdict?: { level: string; reasons: string[] } };
  const reasons = summary.verdict?.reasons ?? [];
  const appUrl = env().APP_URL.replace(/\/+$/, "");

  const sentTo: number[] = [];
  let failed = 0;
  for (const lead of leads) {
    const mail = runAlertMail({
      to: lead.email,
      name: lead.name,
      units: lead.units,
      crewName: crew?.name ?? "your crew",
      run: { id: run.id, title: run.title, startedAt: run.startedAt, summary },
      reasons,
      buildName: build?.name ?? null,
      pilotName: pilot?.name ?? null,
      url: `${appUrl}/runs/${run.id}`,
      settingsUrl: `${appUrl}/settings`,
    });
    try {
      await queueMail(mail, "run-alert", dbx);
      sentTo.push(lead.id);
    } catch (e) {
      if (endsTransaction(e)) throw e;
      failed++;
      console.error(`[alerts] mail about run ${run.id} to user ${lead.id} failed: ${(e as Error).message}`);
    }
  }
  if (sentTo.length) {
    await audit({ crewId: run.crewId, action: ALERT_ACTION, targetType: "run", targetId: run.id, detail: { verdict: "act", reasons, recipients: sentTo, previousVerdict } }, dbx === db() ? undefined : dbx);
  }
  return { sent: sentTo.length, failed, recipients: sentTo };
}
