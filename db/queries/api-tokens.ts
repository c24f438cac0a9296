import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { apiTokens } from "@/db/schema";

export async function listApiTokens(userId: number) {
  return db()
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      tokenPrefix: apiTokens.tokenPrefix,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
      createdAt: apiTokens.createdAt,
    })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(desc(apiTokens.createdAt));
}

export async function getApiTokenByHash(tokenHash: string) {
  const [row] = await db().select().from(apiTokens).where(eq(apiTokens.tokenHash, tokenHash)).limit(1);
  return row ?? null;
}

export async function getApiTokenOfUser(userId: number, tokenId: number) {
  const [row] = await db()
    .select()
    .from(apiTokens)
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId)))
    .limit(1);
  return row ?? null;
}
