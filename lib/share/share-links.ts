/**
 * Share links: a lead makes a read-only link to one debrief for people without an account. The
 * token is shown once; only its SHA-256 is stored (as for password resets and API tokens).
 */
import { and, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { getRun } from "@/db/queries/runs";
import { shareLinks, users, type ShareLink } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { hashToken, newToken } from "@/lib/auth/secrets";
import { env } from "@/lib/env";
import { ConflictError } from "@/lib/errors";
import { MAX_SHARE_DAYS } from "@/lib/validations/share";

const DAY_MS = 86_400_000;

export type ShareLinkState = "active" | "expired" | "revoked";

/** Revoked wins over expired: the lead's act is the better explanation. */
export function shareLinkState(link: Pick<ShareLink, "expiresAt" | "revokedAt">, now = new Date()): ShareLinkState {
  if (link.revokedAt) return "revoked";
  return link.expiresAt.getTime() > now.getTime() ? "active" : "expired";
}

export const shareUrl = (token: string) => `${env().APP_URL.replace(/\/+$/, "")}/share/${token}`;

/** The lead of the run's crew; the crew comes from the run itself. */
const requireShare = (actor: Actor, runId: number) => requireRecordPermission(actor, () => getRun(runId), "share", "Run");

/** Makes a link; the URL (with the token) is returned here and never again. */
export async function createShareLink(actor: Actor, runId: number, input: { expiresInDays: number }, now = new Date()) {
  const { record: run } = await requireShare(actor, runId);
  if (run.status !== "ready") throw new ConflictError("Only a run that has been read and analysed can be shared");
  const days = Math.min(MAX_SHARE_DAYS, Math.max(1, Math.floor(input.expiresInDays)));
  const token = newToken();
  const expiresAt = new Date(now.getTime() + days * DAY_MS);
  const [{ id }] = await db()
    .insert(shareLinks)
    .values({ runId: run.id, tokenHash: hashToken(token), createdBy: actor.user.id, expiresAt, createdAt: now })
    .$returningId();
  await audit({ crewId: run.crewId, actorId: actor.user.id, action: "share-link.created", targetType: "share-link", targetId: id, detail: { runId: run.id, expiresAt: expiresAt.toISOString(), days } });
  return { id, url: shareUrl(token), expiresAt };
}

export interface ShareLinkView {
  id: number;
  createdAt: Date;
  createdBy: string | null;
  expiresAt: Date;
  revokedAt: Date | null;
  viewCount: number;
  lastViewedAt: Date | null;
  state: ShareLinkState;
}

/** The run's links, newest first, for its crew's leads (never the tokens: they are not kept). */
export async function listShareLinks(actor: Actor, runId: number, now = new Date()): Promise<ShareLinkView[]> {
  const { record: run } = await requireShare(actor, runId);
  const rows = await db()
    .select({ link: shareLinks, createdBy: users.name })
    .from(shareLinks)
    .leftJoin(users, eq(users.id, shareLinks.createdBy))
    .where(eq(shareLinks.runId, run.id))
    .orderBy(desc(shareLinks.createdAt), desc(shareLinks.id));
  return rows.map(({ link, createdBy }) => ({
    id: link.id,
    createdAt: link.createdAt,
    createdBy: createdBy ?? null,
    expiresAt: link.expiresAt,
    revokedAt: link.revokedAt,
    viewCount: link.viewCount,
    lastViewedAt: link.lastViewedAt,
    state: shareLinkState(link, now),
  }));
}

/** Withdraws a link at once; revoking twice is harmless. Leads of the run's own crew only. */
export async function revokeShareLink(actor: Actor, linkId: number, now = new Date()) {
  const { record } = await requireRecordPermission(
    actor,
    async () => {
      const [row] = await db().select().from(shareLinks).where(eq(shareLinks.id, linkId)).limit(1);
      const run = row ? await getRun(row.runId) : null;
      return row && run ? { ...row, crewId: run.crewId } : null;
    },
    "share",
    "Share link",
  );
  if (!record.revokedAt) {
    await db().update(shareLinks).set({ revokedAt: now }).where(and(eq(shareLinks.id, linkId), isNull(shareLinks.revokedAt)));
    await audit({ crewId: record.crewId, actorId: actor.user.id, action: "share-link.revoked", targetType: "share-link", targetId: linkId, detail: { runId: record.runId } });
  }
  return { id: linkId, revokedAt: record.revokedAt ?? now };
}
