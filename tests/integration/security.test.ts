import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { memberships } from "@/db/schema";
import { createApiToken } from "@/lib/api-tokens";
import { appUrl, Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";

const plan = { name: "CSRF probe", waypoints: [{ name: "a", lat: 1, lon: 1 }, { name: "b", lat: 1.001, lon: 1 }] };

async function signedIn(label: string) {
  const lead = await newLead(label);
  const client = new Client();
  expect(await client.signIn(lead.email, testPassword)).toBeNull();
  return { ...lead, client };
}

describe("CSRF on cookie-authenticated API writes (ASVS V4.2.2, V13.2.3)", () => {
  it("refuses a cross-origin POST that carries the session cookie", async () => {
    const { client } = await signedIn("csrf-cross");
    const res = await client.request("/api/route-plans", { method: "POST", json: plan, headers: { origin: "https://evil.example" } });
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe("csrf");
  });

  it("refuses a cookie POST whose fetch metadata or Referer names another site", async () => {
    const { client } = await signedIn("csrf-meta");
    expect((await client.request("/api/route-plans", { method: "POST", json: plan, headers: { "sec-fetch-site": "cross-site" } })).status).toBe(403);
    expect((await client.request("/api/route-plans", { method: "POST", json: plan, headers: { referer: "https://evil.example/x" } })).status).toBe(403);
  });

  it("lets the same request through with the app's own Origin", async () => {
    const { client } = await signedIn("csrf-same");
    const res = await client.request("/api/route-plans", { method: "POST", json: plan, headers: { origin: new URL(appUrl).origin } });
    expect(res.status).toBe(201);
  });

  it("exempts a Bearer-token POST without Origin (no ambient credential)", async () => {
    const { actor } = await newLead("csrf-bearer");
    const { token } = await createApiToken(actor, "script");
    const res = await new Client(token).post("/api/route-plans", plan);
    expect(res.status).toBe(201);
  });
});

describe("security headers (ASVS V14.4)", () => {
  function expectCommon(res: Response) {
    const csp = res.headers.get("content-security-policy") ?? "";
    // ASVS V14.4.3 / V14.4.7
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("base-uri 'self'");
    expect(csp).toContain("form-action 'self'");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff"); // V14.4.4
    expect(res.headers.get("permissions-policy")).toBe("camera=(), microphone=(), geolocation=()");
    // The test server runs on http, so no HSTS (V14.4.5 applies over https only).
    expect(res.headers.get("strict-transport-security")).toBeNull();
    return csp;
  }

  it("are on a page, with a per-request nonce that Next puts on its scripts", async () => {
    const res = await new Client().get("/sign-in");
    expect(res.status).toBe(200);
    const csp = expectCommon(res);
    expect(res.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin"); // V14.4.6
    const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
    expect(nonce).toBeTruthy();
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    const html = await res.text();
    expect(html).toContain(`nonce="${nonce}"`);
    const again = (await new Client().get("/sign-in")).headers.get("content-security-policy");
    expect(again).not.toBe(csp);
  });

  it("are on an API answer", async () => {
    const res = await new Client().get("/api/me");
    expect(res.status).toBe(401);
    expectCommon(res);
    expect(res.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
  });

  it("keep no-referrer on a shared debrief", async () => {
    const res = await new Client().get("/share/not-a-real-token");
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    expectCommon(res);
  });
});

describe("the crew's audit log (ASVS V7.1.3, V7.2.1, V7.3.3)", () => {
  it("shows a lead sign-ins and failed sign-ins of members, newest first, with the actor's name", async () => {
    const { client, crewId, email } = await signedIn("audit-lead");
    expect(await new Client().signIn(email, "wrong password entirely")).not.toBeNull();
    const res = await client.get(`/api/crews/${crewId}/audit`);
    expect(res.status).toBe(200);
    const body = (await res.json()) as { entries: { action: string; actorName: string | null; ip: string | null; createdAt: string }[]; total: number; pages: number };
    const actions = body.entries.map((e) => e.action);
    expect(actions).toContain("sign-in");
    expect(actions).toContain("sign-in.failed");
    expect(actions).toContain("user.sign-up");
    const signIn = body.entries.find((e) => e.action === "sign-in")!;
    expect(signIn.actorName).toBe("audit-lead lead");
    expect(signIn.ip).toBeTruthy();
    const times = body.entries.map((e) => Date.parse(e.createdAt));
    expect([...times].sort((a, b) => b - a)).toEqual(times);

    const filtered = (await (await client.get(`/api/crews/${crewId}/audit?action=sign-in.failed`)).json()) as typeof body;
    expect(filtered.entries.length).toBeGreaterThan(0);
    expect(filtered.entries.every((e) => e.action === "sign-in.failed")).toBe(true);

    const page = await client.get("/crew/audit");
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("sign-in.failed");
  });

  it("is hidden from pilots and from other crews", async () => {
    const lead = await newLead("audit-owner");
    const pilot = await signedIn("audit-pilot");
    await db().insert(memberships).values({ crewId: lead.crewId, userId: pilot.userId, role: "pilot" });
    expect((await pilot.client.get(`/api/crews/${lead.crewId}/audit`)).status).toBe(403);
    const outsider = await signedIn("audit-outsider");
    expect((await outsider.client.get(`/api/crews/${lead.crewId}/audit`)).status).toBe(404);
    // With no crew cookie the first crew by name is active: "audit-owner crew", where they are a pilot.
    const page = await pilot.client.get("/crew/audit");
    expect(page.status).toBe(404);
  });
});
