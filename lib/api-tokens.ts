import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { getApiTokenOfUser } from "@/db/queries/api-tokens";
import { apiTokens } from "@/db/schema";
import { audit } from "@/lib/audit";
import { API_TOKEN_PREFIX, type Actor } from "@/lib/auth/actor";
import { hashToken, newToken } from "@/lib/auth/secrets";
import { NotFoundError } from "@/lib/errors";

/** Returns the token in clear exactly once; only its hash is stored. */
export async function createApiToken(actor: Actor, name: string): Promise<{ id: number; token: string }> {
  const token = newToken(API_TOKEN_PREFIX);
  const [{ id }] = await db()
    .insert(apiTokens)
    .values({ userId: actor.user.id, name, tokenPrefix: token.slice(0, 12), tokenHash: hashToken(token) })
    .$returningId();
  await audit({ actorId: actor.user.id, action: "api-token.created", targetType: "api-token", targetId: id, detail: { name } });
  return { id, token };
}

export async function revokeApiToken(actor: Actor, tokenId: number, now = new Date()): Promise<void> {
  const row = await getApiTokenOfUser(actor.user.id, tokenId);
  if (!row) throw new NotFoundError("API token");
  await db().update(apiTokens).set({ revokedAt: now }).where(and(eq(apiTokens.id, tokenId), isNull(apiTokens.revokedAt)));
  await audit({ actorId: actor.user.id, action: "api-token.revoked", targetType: "api-token", targetId: tokenId });
}
