/**
 * Share links against the running test build: a lead makes a link, a signed-out browser opens the
 * shared debrief and its data, views are counted, expired and revoked links are refused with one
 * page that says nothing about the run, a token opens only its own run, and only the run's own
 * leads may make, list and revoke links. The log is our simulator's invented demo data.
 */
import { createHash } from "node:crypto";
import { and, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { auditLog, memberships, runNotes, shareLinks, type Role } from "@/db/schema";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const loop = demoCrew.routePlans[0].waypoints;
const csv = toCsv(simulateRun({ seed: 21, waypoints: loop, hz: 10 }));
const GONE = "This link has expired or was withdrawn";
const NOTE = `<script>alert("x")</script> Antenna moved to the mast top`;

async function member(crewId: number, role: Role) {
  const who = await newLead(`share-${role}`);
  await db().insert(memberships).values({ crewId, userId: who.userId, role });
  const client = new Client();
  expect(await client.signIn(who.email, testPassword)).toBeNull();
  return { ...who, client };
}

const tokenOf = (url: string) => new URL(url).pathname.split("/").pop()!;
const linkRow = async (id: number) => (await db().select().from(shareLinks).where(eq(shareLinks.id, id)))[0];

describe("share links", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  const c = new Client();
  let runId: number;
  let otherRunId: number;
  let title: string;
  let link: { id: number; url: string; expiresAt: string };
  let token: string;
  let pilot: Awaited<ReturnType<typeof member>>;
  let observer: Awaited<ReturnType<typeof member>>;

  beforeAll(async () => {
    lead = await newLead("share");
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const up = await uploadLog(c, "shared-loop.csv", csv);
    const run = await settledRun(c, up.runId);
    expect(run.status).toBe("ready");
    runId = up.runId;
    title = ((await (await c.get(`/api/runs/${runId}`)).json()) as { run: { title: string } }).run.title;
    const other = await uploadLog(c, "private-loop.csv", toCsv(simulateRun({ seed: 22, waypoints: loop, hz: 10 })));
    expect((await settledRun(c, other.runId)).status).toBe("ready");
    otherRunId = other.runId;
    pilot = await member(lead.crewId, "pilot");
    observer = await member(lead.crewId, "observer");
    // Notes are written through a server action in the app; straight into the table here.
    await db().insert(runNotes).values({ runId, authorId: lead.userId, body: NOTE });
  });

  it("lets the lead make a link; only the token's SHA-256 is stored", async () => {
    const before = Date.now();
    const res = await c.post(`/api/runs/${runId}/share-links`, { expiresInDays: 7 });
    expect(res.status, await res.clone().text()).toBe(201);
    link = await res.json();
    expect(link.url).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
    token = tokenOf(link.url);
    const expires = new Date(link.expiresAt).getTime();
    expect(expires).toBeGreaterThanOrEqual(before + 7 * 86_400_000 - 1000);
    expect(expires).toBeLessThanOrEqual(Date.now() + 7 * 86_400_000 + 1000);
    const row = await linkRow(link.id);
    expect(row.runId).toBe(runId);
    expect(row.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);
    const audits = await db().select().from(auditLog).where(and(eq(auditLog.action, "share-link.created"), eq(auditLog.targetId, String(link.id))));
    expect(audits).toHaveLength(1);
    expect(audits[0].crewId).toBe(lead.crewId);
  });

  it("refuses expiries outside 1–90 whole days with 422", async () => {
    for (const expiresInDays of [0, 91, 2.5, "7", null]) {
      expect((await c.post(`/api/runs/${runId}/share-links`, { expiresInDays })).status).toBe(422);
    }
    expect((await c.post(`/api/runs/${runId}/share-links`, {})).status).toBe(422);
  });

  it("shows the debrief to a signed-out visitor: title and figures, no member e-mail, no links into the app", async () => {
    const res = await new Client().get(`/share/${token}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain(title);
    expect(html).toContain("Distance travelled");
    expect(html).toContain('data-testid="verdict"');
    // The note is there as text: React escapes it.
    expect(html).toContain("&lt;script&gt;alert");
    expect(html).not.toContain('<script>alert("x")');
    for (const email of [lead.email, pilot.email, observer.email]) expect(html).not.toContain(email);
    expect(html).not.toMatch(/href="\/(dashboard|runs|builds|crew|settings|sign-in)/);
    expect(html).not.toContain(`/api/runs/${runId}/original`);
    expect(html).toContain(`/api/share/${token}`);
    // Referrer-Policy keeps the token out of Referer headers (tiles); robots keep the page unindexed.
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    expect(res.headers.get("x-robots-tag")).toMatch(/noindex/);
    expect(html).toMatch(/<meta name="robots" content="noindex, nofollow/);
    expect(html).toContain('<meta name="referrer" content="no-referrer"');
  });

  it("counts one view per page load, and none for the data the page fetches", async () => {
    const views = async () => (await linkRow(link.id)).viewCount;
    const n = await views();
    await new Client().get(`/share/${token}`);
    await new Client().get(`/share/${token}`);
    expect(await views()).toBe(n + 2);
    await new Client().get(`/api/share/${token}/track`);
    expect(await views()).toBe(n + 2);
    expect((await linkRow(link.id)).lastViewedAt).toBeInstanceOf(Date);
    const listed = (await (await c.get(`/api/runs/${runId}/share-links`)).json()) as { shareLinks: { id: number; viewCount: number; state: string; createdBy: string }[] };
    const mine = listed.shareLinks.find((l) => l.id === link.id)!;
    expect(mine).toMatchObject({ viewCount: n + 2, state: "active", createdBy: "share lead" });
    expect(JSON.stringify(listed)).not.toMatch(/tokenHash|token_hash/);
  });

  it("serves the token's run data exactly as the run routes do, without a session", async () => {
    const anon = new Client();
    for (const path of ["/series?fields=rssiDbm,lqPct,voltageV&points=800", "/series?fields=rssiDbm&from=10&to=12", "/track", "/points?fields=distanceFromHomeM,rssiDbm&points=300"]) {
      const shared = await anon.get(`/api/share/${token}${path}`);
      expect(shared.status, path).toBe(200);
      const own = await c.get(`/api/runs/${runId}${path}`);
      expect(await shared.json()).toEqual(await own.json());
      expect(shared.headers.get("etag")).toBe(own.headers.get("etag"));
      expect(shared.headers.get("cache-control")).toBe(own.headers.get("cache-control"));
    }
    expect((await anon.get(`/api/share/${token}/series?fields=warp`)).status).toBe(422);
  });

  it("opens nothing but its own run", async () => {
    const anon = new Client();
    // The share routes take no run id: a query naming another run is ignored.
    const s = await (await anon.get(`/api/share/${token}/series?fields=rssiDbm&runId=${otherRunId}&id=${otherRunId}`)).json();
    expect(s.runId).toBe(runId);
    // The token is no session: the run routes still want one.
    for (const path of [`/api/runs/${otherRunId}/series?fields=rssiDbm`, `/api/runs/${otherRunId}/track`, `/api/runs/${runId}/series?fields=rssiDbm`, `/api/runs/${otherRunId}`, `/api/runs/${runId}/original`]) {
      expect((await anon.request(path, { headers: { authorization: `Bearer ${token}` } })).status, path).toBe(401);
      expect((await anon.get(`${path}${path.includes("?") ? "&" : "?"}token=${token}`)).status, path).toBe(401);
    }
    // A run id (or anything else) in the token's place is no link.
    for (const bad of [String(otherRunId), `${token.slice(0, -1)}${token.endsWith("A") ? "B" : "A"}`, `..%2F${otherRunId}`, token + "x"]) {
      expect((await anon.get(`/api/share/${bad}/series?fields=rssiDbm`)).status).toBe(404);
    }
    expect((await anon.get(`/api/share/${token}/../../runs/${otherRunId}/series?fields=rssiDbm`)).status).toBe(401);
    // Exports and share management are not reachable with the token either.
    expect((await anon.get(`/api/runs/${runId}/export/track.gpx`)).status).toBe(401);
    expect((await anon.get(`/api/runs/${runId}/share-links`)).status).toBe(401);
  });

  it("refuses an unknown or malformed token with the same page and a 404", async () => {
    for (const bad of ["A".repeat(43), "short", "not-a-token-at-all"]) {
      const res = await new Client().get(`/share/${bad}`);
      expect(res.status).toBe(404);
      const html = await res.text();
      expect(html).toContain(GONE);
    }
  });

  it("refuses an expired link (page and data) and counts nothing", async () => {
    const made = (await (await c.post(`/api/runs/${runId}/share-links`, { expiresInDays: 1 })).json()) as typeof link;
    const t = tokenOf(made.url);
    expect((await new Client().get(`/share/${t}`)).status).toBe(200);
    await db().update(shareLinks).set({ expiresAt: new Date(Date.now() - 60_000) }).where(eq(shareLinks.id, made.id));
    const res = await new Client().get(`/share/${t}`);
    expect(res.status).toBe(404);
    const html = await res.text();
    expect(html).toContain(GONE);
    expect(html).not.toContain(title);
    expect((await new Client().get(`/api/share/${t}/track`)).status).toBe(404);
    expect((await linkRow(made.id)).viewCount).toBe(1);
    const listed = (await (await c.get(`/api/runs/${runId}/share-links`)).json()) as { shareLinks: { id: number; state: string }[] };
    expect(listed.shareLinks.find((l) => l.id === made.id)!.state).toBe("expired");
  });

  it("keeps pilots and observers from making, listing or revoking links (403), and other crews out (404)", async () => {
    for (const who of [pilot, observer]) {
      expect((await who.client.post(`/api/runs/${runId}/share-links`, { expiresInDays: 7 })).status).toBe(403);
      expect((await who.client.get(`/api/runs/${runId}/share-links`)).status).toBe(403);
      expect((await who.client.request(`/api/share-links/${link.id}`, { method: "DELETE" })).status).toBe(403);
    }
    const outsider = await newLead("share-outsider");
    const o = new Client();
    expect(await o.signIn(outsider.email, testPassword)).toBeNull();
    expect((await o.post(`/api/runs/${runId}/share-links`, { expiresInDays: 7 })).status).toBe(404);
    expect((await o.get(`/api/runs/${runId}/share-links`)).status).toBe(404);
    expect((await o.request(`/api/share-links/${link.id}`, { method: "DELETE" })).status).toBe(404);
    expect((await c.request(`/api/share-links/999999999`, { method: "DELETE" })).status).toBe(404);
    expect((await new Client().request(`/api/share-links/${link.id}`, { method: "DELETE" })).status).toBe(401);
    expect((await linkRow(link.id)).revokedAt).toBeNull();
  });

  it("lets the lead revoke a link: page and data stop at once, the list says revoked, the audit log has it", async () => {
    const res = await c.request(`/api/share-links/${link.id}`, { method: "DELETE" });
    expect(res.status).toBe(200);
    expect((await c.request(`/api/share-links/${link.id}`, { method: "DELETE" })).status).toBe(200);
    const page = await new Client().get(`/share/${token}`);
    expect(page.status).toBe(404);
    expect(await page.text()).toContain(GONE);
    for (const path of ["/series?fields=rssiDbm", "/track", "/points?fields=rssiDbm"]) expect((await new Client().get(`/api/share/${token}${path}`)).status).toBe(404);
    const listed = (await (await c.get(`/api/runs/${runId}/share-links`)).json()) as { shareLinks: { id: number; state: string; revokedAt: string | null }[] };
    const mine = listed.shareLinks.find((l) => l.id === link.id)!;
    expect(mine.state).toBe("revoked");
    expect(mine.revokedAt).toBeTruthy();
    const audits = await db()
      .select({ n: sql<number>`COUNT(*)` })
      .from(auditLog)
      .where(and(eq(auditLog.action, "share-link.revoked"), eq(auditLog.targetId, String(link.id))));
    expect(Number(audits[0].n)).toBe(1);
  });
});
