import { describe, expect, it } from "vitest";
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
    // Only a hash is stored: the clear token appears nowhere in what the app reads back.
    expect(JSON.stringify(listed)).not.toContain(token.slice(12));

    await revokeApiToken(actor, id);
    expect((await bearer.get("/api/me")).status).toBe(401);
  });

  it("refuses tokens that were never issued or are malformed", async () => {
    expect((await new Client("sortie_forged-token-value-000000000000000000000").get("/api/me")).status).toBe(401);
    expect((await new Client("not-even-our-prefix").get("/api/me")).status).toBe(401);
  });
});
