import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { getUserWithSecretByEmail } from "@/db/queries/users";
import { passwordResets, users } from "@/db/schema";
import { audit } from "@/lib/audit";
import { hashPassword } from "@/lib/auth/password";
import { hashToken, newToken } from "@/lib/auth/secrets";
import { env } from "@/lib/env";
import { ValidationError } from "@/lib/errors";
import { passwordResetMail } from "@/lib/mail/templates";
import { queueMail } from "@/lib/mail/outbox";

export const RESET_TTL_MS = 60 * 60 * 1000;

/**
 * E-mails a one-time reset link when the account exists. The caller always shows the same
 * answer, so the form does not reveal which addresses have accounts.
 */
export async function requestPasswordReset(email: string, now = new Date()): Promise<void> {
  const user = await getUserWithSecretByEmail(email);
  if (!user) return;
  const token = newToken();
  const expiresAt = new Date(now.getTime() + RESET_TTL_MS);
  await db().insert(passwordResets).values({ userId: user.id, tokenHash: hashToken(token), expiresAt });
  const url = `${env().APP_URL}/reset/${encodeURIComponent(token)}`;
  await queueMail(passwordResetMail({ to: user.email, name: user.name, url, expiresAt }), "password-reset");
  await audit({ actorId: user.id, action: "password.reset-requested", targetType: "user", targetId: user.id });
}

const spentLink = "This reset link has expired or was already used; ask for a new one";

/** Sets a new password from a valid link; the link (and any other open link for the user) stops working. */
export async function resetPassword(token: string, password: string, now = new Date()): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password);
  const result = await db().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(passwordResets)
      .where(eq(passwordResets.tokenHash, hashToken(token)))
      .for("update");
    if (!row || row.usedAt || row.expiresAt <= now) throw new ValidationError(spentLink);
    // The new password and the end of every older session commit together (ASVS V3.3.3).
    await tx.update(users).set({ passwordHash, sessionsValidAfter: new Date() }).where(eq(users.id, row.userId));
    await tx
      .update(passwordResets)
      .set({ usedAt: now })
      .where(and(eq(passwordResets.userId, row.userId), isNull(passwordResets.usedAt)));
    const [u] = await tx.select({ email: users.email }).from(users).where(eq(users.id, row.userId));
    return { email: u.email, userId: row.userId };
  });
  await audit({ actorId: result.userId, action: "password.reset", targetType: "user", targetId: result.userId });
  return { email: result.email };
}

/** Whether a reset link can still be used, for the reset page to show the form or an explanation. */
export async function resetLinkUsable(token: string, now = new Date()): Promise<boolean> {
  const [row] = await db().select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(token))).limit(1);
  return !!row && !row.usedAt && row.expiresAt > now;
}
