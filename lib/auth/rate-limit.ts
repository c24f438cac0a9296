import { and, count, eq, gt } from "drizzle-orm";
import { db } from "@/db/client";
import { loginAttempts } from "@/db/schema";
import { env } from "@/lib/env";

/**
 * Sign-in throttling kept in MariaDB, so several app instances share one count.
 * Limits failures per e-mail and (more loosely) per client address in a sliding window.
 */
export async function loginBlocked(email: string, ip: string, now = new Date()): Promise<{ blocked: boolean; retryAfterS: number }> {
  const { LOGIN_MAX_FAILURES, LOGIN_WINDOW_MINUTES } = env();
  const since = new Date(now.getTime() - LOGIN_WINDOW_MINUTES * 60_000);
  const failures = (where: ReturnType<typeof eq>) =>
    db()
      .select({ n: count() })
      .from(loginAttempts)
      .where(and(where, eq(loginAttempts.succeeded, false), gt(loginAttempts.createdAt, since)))
      .then((r) => r[0]?.n ?? 0);
  const [byEmail, byIp] = await Promise.all([failures(eq(loginAttempts.email, email)), failures(eq(loginAttempts.ip, ip))]);
  // An address may front a whole club on one field hotspot, so it gets more room than one account.
  const blocked = byEmail >= LOGIN_MAX_FAILURES || byIp >= LOGIN_MAX_FAILURES * 5;
  return { blocked, retryAfterS: LOGIN_WINDOW_MINUTES * 60 };
}

export async function recordLoginAttempt(email: string, ip: string, succeeded: boolean): Promise<void> {
  await db().insert(loginAttempts).values({ email: email.slice(0, 254), ip: ip.slice(0, 64), succeeded });
}

/**
 * Client address from proxy headers. The rightmost X-Forwarded-For entry is the one our own load
 * balancer appended; entries to its left come from the client and could be forged.
 */
export function clientIp(headers: Headers | Record<string, string | string[] | undefined>): string {
  const get = (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v[0] : v;
  };
  const forwarded = get("x-forwarded-for")?.split(",").pop()?.trim();
  return forwarded || get("x-real-ip") || "local";
}
