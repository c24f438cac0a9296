import { and, eq, sql } from "drizzle-orm";
import { db, inConnectionTransaction, type Database } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { env } from "@/lib/env";
import { deliverMail, type Mail } from "./transport";

/** While one instance is sending a message, others leave it alone this long (SMTP timeouts are 10 s + 60 s). */
const SEND_LEASE_S = 180;

export type MailKind = "invitation" | "password-reset" | "run-alert";

const g = globalThis as unknown as { sortieMailPoke?: () => void };

/** Lets the background worker of this process send at once instead of at its next poll. */
export function onMailQueued(poke: () => void): void {
  g.sortieMailPoke = poke;
}

/**
 * Writes the message to the outbox; the background worker sends it, now or, when SMTP is down,
 * on a later attempt. Callers never wait on SMTP and an outage loses nothing.
 */
export async function queueMail(mail: Mail, kind: MailKind, dbx: Database = db()): Promise<number> {
  const [{ id }] = await dbx
    .insert(mailOutbox)
    .values({ toAddress: mail.to, subject: mail.subject.slice(0, 300), textBody: mail.text, htmlBody: mail.html, kind, nextAttemptAt: sql`NOW(3)` })
    .$returningId();
  // Inside a caller's transaction the row is not visible yet; the worker's next poll sends it.
  if (dbx === db()) g.sortieMailPoke?.();
  return id;
}

/** Seconds before attempt `attempts + 1`: base × 2^(attempts − 1), capped at six hours. */
export function mailRetryDelayS(attempts: number, baseS: number): number {
  return Math.min(6 * 3600, baseS * 2 ** Math.max(0, attempts - 1));
}

/**
 * Leases the oldest due message to this instance (SKIP LOCKED: instances never wait on each
 * other). The lease is the bumped attempt count: later writes about this send only land while it
 * is still the current one, so a send that outlived its lease cannot overwrite a newer one.
 */
async function leaseNext(): Promise<{ id: number; attempts: number } | null> {
  return inConnectionTransaction(async (conn) => {
    const [rows] = await conn.query(
      "SELECT id, attempts FROM mail_outbox WHERE state = 'pending' AND next_attempt_at <= NOW(3) ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED",
    );
    const row = (rows as { id: number; attempts: number }[])[0];
    if (row) {
      await conn.query(`UPDATE mail_outbox SET attempts = attempts + 1, next_attempt_at = NOW(3) + INTERVAL ${SEND_LEASE_S} SECOND WHERE id = ?`, [row.id]);
    }
    return row ? { id: Number(row.id), attempts: row.attempts + 1 } : null;
  });
}

/** Sends what is due, one message at a time; returns how many went out. Run by the background worker. */
export async function drainOutbox(stopping: () => boolean = () => false): Promise<{ sent: number; failed: number }> {
  const { MAIL_RETRY_BASE_S, MAIL_MAX_ATTEMPTS } = env();
  let sent = 0;
  let failed = 0;
  for (;;) {
    if (stopping()) return { sent, failed };
    const lease = await leaseNext();
    if (!lease) return { sent, failed };
    const mine = and(eq(mailOutbox.id, lease.id), eq(mailOutbox.state, "pending"), eq(mailOutbox.attempts, lease.attempts));
    const [row] = await db().select().from(mailOutbox).where(eq(mailOutbox.id, lease.id));
    if (!row) continue;
    let error: string | null = null;
    try {
      await deliverMail({ to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody });
    } catch (e) {
      error = ((e as Error).message ?? String(e)).slice(0, 500);
    }
    if (error === null) {
      // Delivered. If this write fails (database gone), the lease runs out and the mail goes again:
      // a duplicate is better than a lost invitation. The bodies can carry links: not kept.
      await db().update(mailOutbox).set({ state: "sent", sentAt: sql`NOW(3)`, textBody: "", htmlBody: "", lastError: null }).where(mine);
      sent++;
      continue;
    }
    failed++;
    const giveUp = lease.attempts >= MAIL_MAX_ATTEMPTS;
    const delayS = mailRetryDelayS(lease.attempts, MAIL_RETRY_BASE_S);
    await db()
      .update(mailOutbox)
      .set(
        giveUp
          ? { state: "failed", lastError: error, textBody: "", htmlBody: "" }
          : { lastError: error, nextAttemptAt: sql`NOW(3) + INTERVAL ${Math.round(delayS * 1e6)} MICROSECOND` },
      )
      .where(mine);
    console.error(
      `[mail] ${row.kind} mail ${row.id} not sent (attempt ${lease.attempts}/${MAIL_MAX_ATTEMPTS}): ${error}${giveUp ? "; giving up" : `; retrying in ${delayS} s`}`,
    );
  }
}

/** Messages not yet handed to SMTP (for scripts and tests that wait for mail to settle). */
export async function pendingMail(): Promise<number> {
  const [row] = await db().select({ n: sql<number>`COUNT(*)` }).from(mailOutbox).where(eq(mailOutbox.state, "pending"));
  return Number(row?.n ?? 0);
}
