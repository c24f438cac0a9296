import { eq } from "drizzle-orm";
import { getServerSession } from "next-auth";
import { headers } from "next/headers";
import { db } from "@/db/client";
import { getApiTokenByHash } from "@/db/queries/api-tokens";
import { getUserById, type PublicUser } from "@/db/queries/users";
import { apiTokens } from "@/db/schema";
import { UnauthenticatedError } from "@/lib/errors";
import { authOptions } from "./options";
import { hashToken } from "./secrets";
import { userForSession } from "./sessions";

export interface Actor {
  user: PublicUser;
  via: "session" | "api-token";
}

export const API_TOKEN_PREFIX = "sortie_";

/** Resolves who is calling: a personal API token in `Authorization: Bearer …`, else the session cookie. */
export async function getActor(): Promise<Actor | null> {
  const h = await headers();
  const auth = h.get("authorization");
  if (auth) {
    const m = /^Bearer\s+(\S+)$/i.exec(auth);
    if (!m) return null;
    return actorFromApiToken(m[1]);
  }
  const session = await getServerSession(authOptions());
  const claims = session?.user as { id?: number; sid?: string; signedInAt?: number } | undefined;
  if (typeof claims?.id !== "number") return null;
  // A signed-out or ended session is refused here, on every request (ASVS V3.3.1, V3.3.3).
  const user = await userForSession({ uid: claims.id, sid: claims.sid, signedInAt: claims.signedInAt });
  return user ? { user, via: "session" } : null;
}

async function actorFromApiToken(token: string): Promise<Actor | null> {
  if (!token.startsWith(API_TOKEN_PREFIX) || token.length > 200) return null;
  const row = await getApiTokenByHash(hashToken(token));
  if (!row || row.revokedAt) return null;
  const user = await getUserById(row.userId);
  if (!user) return null;
  // Last use is shown on the token page; a minute's precision is plenty, so skip most writes.
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
    await db().update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id));
  }
  return { user, via: "api-token" };
}

export async function requireActor(): Promise<Actor> {
  const actor = await getActor();
  if (!actor) throw new UnauthenticatedError();
  return actor;
}
