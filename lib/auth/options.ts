import { randomBytes } from "node:crypto";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getUserWithSecretByEmail } from "@/db/queries/users";
import { audit } from "@/lib/audit";
import { env } from "@/lib/env";
import { signInSchema } from "@/lib/validations/auth";
import { burnPasswordCheck, verifyPassword } from "./password";
import { clientIp, loginBlocked, recordLoginAttempt } from "./rate-limit";
import { revokeSession, SESSION_MAX_AGE_S } from "./sessions";

export const SIGN_IN_RATE_LIMITED = "RateLimited";

/** Built on demand so importing this module never reads settings (e.g. during `next build`). */
export function authOptions(): NextAuthOptions {
  const secure = env().APP_URL.startsWith("https://");
  return {
    secret: env().NEXTAUTH_SECRET,
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_S },
    pages: { signIn: "/sign-in", error: "/sign-in" },
    // next-auth's cookies are HttpOnly, SameSite=Lax and path / by default; over https they are
    // also Secure and __Secure- prefixed (ASVS V3.4.1, V3.4.2, V3.4.3, V3.4.5).
    useSecureCookies: secure,
    providers: [
      CredentialsProvider({
        id: "credentials",
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, req) {
          const parsed = signInSchema.safeParse(credentials ?? {});
          if (!parsed.success) return null;
          const { email, password } = parsed.data;
          const ip = clientIp(req?.headers ?? {});
          const limit = await loginBlocked(email, ip);
          if (limit.blocked) {
            await audit({ action: "sign-in.rate-limited", detail: { email }, ip });
            throw new Error(SIGN_IN_RATE_LIMITED);
          }
          const user = await getUserWithSecretByEmail(email);
          const ok = user ? await verifyPassword(password, user.passwordHash) : (await burnPasswordCheck(password), false);
          await recordLoginAttempt(email, ip, ok);
          if (!user || !ok) {
            // ASVS V7.1.3, V7.2.1: every sign-in decision is logged with the client address; a failure
            // against a real account names it, so its crews' leads see attempts on their members.
            await audit({ action: "sign-in.failed", ...(user ? { targetType: "user", targetId: user.id } : {}), detail: { email }, ip });
            return null;
          }
          await audit({ actorId: user.id, action: "sign-in", targetType: "user", targetId: user.id, ip });
          return { id: String(user.id), email: user.email, name: user.name };
        },
      }),
    ],
    callbacks: {
      jwt({ token, user }) {
        if (user) {
          token.uid = Number(user.id);
          // Fixed at sign-in and kept through refreshes: what sign-out and a password reset void (lib/auth/sessions.ts).
          token.sid = randomBytes(16).toString("hex");
          token.signedInAt = Date.now();
        }
        return token;
      },
      session({ session, token }) {
        if (session.user && typeof token.uid === "number") {
          const u = session.user as { id?: number; sid?: string; signedInAt?: number };
          u.id = token.uid;
          u.sid = typeof token.sid === "string" ? token.sid : undefined;
          u.signedInAt = typeof token.signedInAt === "number" ? token.signedInAt : undefined;
        }
        return session;
      },
    },
    events: {
      // ASVS V3.3.1: signing out ends the session on the server too, not only in this browser.
      async signOut({ token }) {
        const uid = typeof token?.uid === "number" ? token.uid : null;
        if (uid && typeof token.sid === "string") {
          await revokeSession(token.sid, uid);
          await audit({ actorId: uid, action: "sign-out", targetType: "user", targetId: uid });
        }
      },
    },
  };
}
