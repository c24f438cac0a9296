import { createHash } from "node:crypto";
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { createApiToken, revokeApiToken } from "@/lib/api-tokens";
import { listApiTokens } from "@/db/queries/api-tokens";
import { Client } from "../helpers/http";
import { newLead } from "../helpers/people";

describe("personal API tokens", () => {
  it("authenticate as their user until revoked, and record last use", async () => {
    const { actor, crewId } = await newLead("token");
    const { id, token } = await createApiToken(actor, "field laptop");
    const bearer = new Client(token);

    const me = await bearer.get("/api/me");
    expect(me.status).toBe(200);
    const body = await me.json();
    expect(body.via).toBe("api-token");
    expect(body.crews[0].crewId).toBe(crewId);
    expect((await bearer.post("/api/route-plans", { name: "From script", waypoints: [{ name: "a", lat: 1, lon: 1 }, { name: "b", lat: 1.001, lon: 1 }] })).status).toBe(201);

    const listed = await listApiTokens(actor.user.id);
    expect(listed[0].lastUsedAt).toBeInstanceOf(Date);
    // Only a SHA-256 of the token is stored: the stored row holds the hash and no part of the secret.
    const [stored] = (await db().execute(sql`SELECT * FROM api_tokens WHERE id = ${id}`)) as unknown as [Record<string, unknown>[]];
    expect(stored[0].token_hash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(stored[0])).not.toContain(token.slice(12));

    await revokeApiToken(actor, id);
    expect((await bearer.get("/api/me")).status).toBe(401);
  });

  it("refuses tokens that were never issued or are malformed", async () => {
    expect((await new Client("sortie_forged-token-value-000000000000000000000").get("/api/me")).status).toBe(401);
    expect((await new Client("not-even-our-prefix").get("/api/me")).status).toBe(401);
  });
});
