import { eq, lt, sql } from "drizzle-orm";
import { db, type Database } from "@/db/client";
import { publicColumns, type PublicUser } from "@/db/queries/users";
import { revokedSessions, users } from "@/db/schema";

export const SESSION_MAX_AGE_S = 14 * 24 * 3600;

/** What a signed session cookie says about itself (lib/auth/options.ts callbacks). */
export interface SessionClaims {
  uid: number;
  sid?: string;
  signedInAt?: number;
}

/** Records a signed-out session so a copy of its cookie is refused until it would have expired. */
export async function revokeSession(sid: string, userId: number): Promise<void> {
  await db()
    .insert(revokedSessions)
    .values({ sid, userId, expiresAt: new Date(Date.now() + SESSION_MAX_AGE_S * 1000) })
    .onDuplicateKeyUpdate({ set: { sid } });
}

/** Ends every session of a user signed in before now (after a password reset); `dbx` may be a transaction. */
export async function endAllSessions(userId: number, now = new Date(), dbx: Database = db()): Promise<void> {
  await dbx.update(users).set({ sessionsValidAfter: now }).where(eq(users.id, userId));
}

/**
 * The user behind a session cookie, or null when the session was signed out, was signed in before
 * the user's sessions were ended, or predates session ids. One query, as before this check.
 */
export async function userForSession(claims: SessionClaims): Promise<PublicUser | null> {
  if (!claims.sid || typeof claims.signedInAt !== "number") return null;
  // An absolute lifetime: a cookie kept fresh by refreshing never outlives its revocation record.
  if (Date.now() - claims.signedInAt > SESSION_MAX_AGE_S * 1000) return null;
  const [row] = await db()
    .select({
      ...publicColumns,
      validAfter: users.sessionsValidAfter,
      revoked: sql<number>`EXISTS (SELECT 1 FROM ${revokedSessions} WHERE ${revokedSessions.sid} = ${claims.sid})`,
    })
    .from(users)
    .where(eq(users.id, claims.uid))
    .limit(1);
  if (!row || Number(row.revoked)) return null;
  if (row.validAfter && claims.signedInAt < row.validAfter.getTime()) return null;
  const { validAfter: _v, revoked: _r, ...user } = row;
  return user;
}

/** Drops revocations of sessions that have expired anyway (run by the background worker). */
export async function pruneRevokedSessions(): Promise<void> {
  await db().delete(revokedSessions).where(lt(revokedSessions.expiresAt, sql`NOW(3)`));
}
