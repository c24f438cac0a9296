import { and, eq, inArray, sql } from "drizzle-orm";
import { db, pool } from "@/db/client";
import { mailOutbox } from "@/db/schema";
import { env } from "@/lib/env";
import { deliverMail, type Mail } from "./transport";

/** While one instance is sending a message, others leave it alone this long. */
const SEND_LEASE_S = 180;
const BATCH = 10;

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
export async function queueMail(mail: Mail, kind: MailKind): Promise<number> {
  const [{ id }] = await db()
    .insert(mailOutbox)
    .values({ toAddress: mail.to, subject: mail.subject.slice(0, 300), textBody: mail.text, htmlBody: mail.html, kind, nextAttemptAt: sql`NOW(3)` })
    .$returningId();
  g.sortieMailPoke?.();
  return id;
}

/** Seconds before attempt `attempts + 1`: base × 2^(attempts − 1), capped at six hours. */
export function mailRetryDelayS(attempts: number, baseS: number): number {
  return Math.min(6 * 3600, baseS * 2 ** Math.max(0, attempts - 1));
}

/** Leases up to BATCH due messages to this instance (SKIP LOCKED: instances never wait on each other). */
async function leaseDue(): Promise<{ id: number; attempts: number }[]> {
  const conn = await pool().getConnection();
  try {
    await conn.beginTransaction();
    const [rows] = await conn.query(
      "SELECT id, attempts FROM mail_outbox WHERE state = 'pending' AND next_attempt_at <= NOW(3) ORDER BY id LIMIT ? FOR UPDATE SKIP LOCKED",
      [BATCH],
    );
    const due = (rows as { id: number; attempts: number }[]).map((r) => ({ id: Number(r.id), attempts: r.attempts + 1 }));
    if (due.length) {
      await conn.query(
        `UPDATE mail_outbox SET attempts = attempts + 1, next_attempt_at = NOW(3) + INTERVAL ${SEND_LEASE_S} SECOND WHERE id IN (?)`,
        [due.map((d) => d.id)],
      );
    }
    await conn.commit();
    return due;
  } catch (e) {
    await conn.rollback().catch(() => {});
    throw e;
  } finally {
    conn.release();
  }
}

/** Sends what is due; returns how many went out. Run by the background worker. */
export async function drainOutbox(): Promise<{ sent: number; failed: number }> {
  const { MAIL_RETRY_BASE_S, MAIL_MAX_ATTEMPTS } = env();
  let sent = 0;
  let failed = 0;
  for (;;) {
    const due = await leaseDue();
    if (due.length === 0) return { sent, failed };
    const rows = await db().select().from(mailOutbox).where(inArray(mailOutbox.id, due.map((d) => d.id)));
    for (const row of rows) {
      const attempts = due.find((d) => d.id === row.id)!.attempts;
      try {
        await deliverMail({ to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody });
        // The bodies can carry invitation or reset links: not kept once delivered.
        await db()
          .update(mailOutbox)
          .set({ state: "sent", sentAt: sql`NOW(3)`, textBody: "", htmlBody: "", lastError: null })
          .where(eq(mailOutbox.id, row.id));
        sent++;
      } catch (e) {
        failed++;
        const message = ((e as Error).message ?? String(e)).slice(0, 500);
        const giveUp = attempts >= MAIL_MAX_ATTEMPTS;
        const delayS = mailRetryDelayS(attempts, MAIL_RETRY_BASE_S);
        await db()
          .update(mailOutbox)
          .set(
            giveUp
              ? { state: "failed", lastError: message }
              : { lastError: message, nextAttemptAt: sql`NOW(3) + INTERVAL ${Math.round(delayS * 1e6)} MICROSECOND` },
          )
          .where(and(eq(mailOutbox.id, row.id), eq(mailOutbox.state, "pending")));
        console.error(
          `[mail] ${row.kind} mail ${row.id} not sent (attempt ${attempts}/${MAIL_MAX_ATTEMPTS}): ${message}${giveUp ? "; giving up" : `; retrying in ${delayS} s`}`,
        );
      }
    }
  }
}

/** Messages not yet handed to SMTP (for scripts and tests that wait for mail to settle). */
export async function pendingMail(): Promise<number> {
  const [row] = await db().select({ n: sql<number>`COUNT(*)` }).from(mailOutbox).where(eq(mailOutbox.state, "pending"));
  return Number(row?.n ?? 0);
}
