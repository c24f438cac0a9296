/**
 * A share token → its one run. Unknown, expired and withdrawn links all answer the same 404, so a
 * holder learns nothing about whether the run (or the link) exists.
 */
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { getRun } from "@/db/queries/runs";
import { shareLinks, type Run, type ShareLink } from "@/db/schema";
import { hashToken } from "@/lib/auth/secrets";
import { NotFoundError } from "@/lib/errors";
import { shareTokenSchema } from "@/lib/validations/share";

export const SHARE_GONE_MESSAGE = "This link has expired or was withdrawn";

export class ShareLinkGoneError extends NotFoundError {
  constructor() {
    super();
    this.message = SHARE_GONE_MESSAGE;
  }
}

const activeWhere = (tokenHash: string, now: Date) => and(eq(shareLinks.tokenHash, tokenHash), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, now));

/** The active link and its run, or null. Counts nothing (the data routes call this per request). */
export async function findActiveShare(token: string, now = new Date()): Promise<{ link: ShareLink; run: Run } | null> {
  if (!shareTokenSchema.safeParse(token).success) return null;
  const [link] = await db().select().from(shareLinks).where(activeWhere(hashToken(token), now)).limit(1);
  if (!link) return null;
  const run = await getRun(link.runId);
  return run ? { link, run } : null;
}

/**
 * As findActiveShare, counting one view: the count and last view are written in the same
 * statement that checks the link is still active, so a link withdrawn meanwhile counts nothing.
 */
export async function openShare(token: string, now = new Date()): Promise<{ link: ShareLink; run: Run } | null> {
  if (!shareTokenSchema.safeParse(token).success) return null;
  const tokenHash = hashToken(token);
  const [res] = await db()
    .update(shareLinks)
    .set({ viewCount: sql`${shareLinks.viewCount} + 1`, lastViewedAt: now })
    .where(activeWhere(tokenHash, now));
  if ((res as unknown as { affectedRows: number }).affectedRows === 0) return null;
  const [link] = await db().select().from(shareLinks).where(eq(shareLinks.tokenHash, tokenHash)).limit(1);
  const run = link ? await getRun(link.runId) : null;
  return link && run ? { link, run } : null;
}

/** The run a share token opens, for the share data routes; 404 (one message) otherwise. */
export async function requireSharedRun(token: string): Promise<Run> {
  const found = await findActiveShare(token);
  if (!found) throw new ShareLinkGoneError();
  return found.run;
}
