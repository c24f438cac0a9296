/**
 * The authorisation matrix: every API route handler (found by walking app/api/**\/route.ts and
 * reading the HTTP methods each file exports) × every caller (signed out, observer, pilot, lead)
 * × the caller's own crew and another crew, against the running test build.
 *
 * OWASP ASVS 4.0.3:
 * - V4.1.1 — access control is enforced on the trusted service layer: every cell is an HTTP call to
 *   the server, never a UI hint.
 * - V4.1.3 — least privilege: a member below a route's minimum role gets 403, signed out 401.
 * - V4.2.1 — protection against insecure direct object references: another crew's record answers
 *   404 (even to a lead of the other crew), and no other crew's data appears in any answer.
 *
 * A route that is not in `expectations` (and not listed as public) fails "no expectation for …",
 * so a new route cannot ship without its row. Server actions are not covered here.
 */
import { randomBytes } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoCrew } from "@/db/demo-crew";
import { getUserById } from "@/db/queries/users";
import type { Role } from "@/db/schema";
import { createApiToken } from "@/lib/api-tokens";
import { acceptInvitation } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { markAsBenchRun } from "../helpers/bench-log";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { tinyPng } from "../helpers/tiny-png";
import { settledRun, uploadLog } from "../helpers/uploads";

// ---- Route discovery -------------------------------------------------------------------------

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS"] as const;
const apiDir = join(process.cwd(), "app", "api");

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    if (e.isDirectory()) return routeFiles(p);
    return /^route\.(ts|tsx|js|mjs)$/.test(e.name) ? [p] : [];
  });
}

/** Exported handlers of a route file: `export const GET =`, `export async function GET`, `export { h as GET }`. */
function exportedMethods(source: string): string[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) found.add(m[1]);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(",")) {
      const name = part.trim().split(/\s+as\s+/).pop()?.trim();
      if (name) found.add(name);
    }
  }
  return METHODS.filter((x) => found.has(x));
}

const discovered: string[] = routeFiles(apiDir)
  .flatMap((file) => {
    const path = "/api/" + relative(apiDir, file).split(sep).slice(0, -1).join("/");
    return exportedMethods(readFileSync(file, "utf8")).map((m) => `${m} ${path.replace(/\/$/, "")}`);
  })
  .sort();

// ---- Fixtures --------------------------------------------------------------------------------

type Who = "anon" | Role;
type CrewSide = "own" | "other";
const WHO: Who[] = ["anon", "observer", "pilot", "lead"];
const rank: Record<Role, number> = { observer: 1, pilot: 2, lead: 3 };

interface Fixture {
  crewId: number;
  lead: Client;
  runId: number;
  /** A run uploaded by the crew's pilot (crew B has none: its lead's run). */
  pilotRunId: number;
  /** An upload already completed by the pilot (B: its lead). */
  uploadId: number;
  buildId: number;
  photoId: number;
  planId: number;
  columnMapId: number;
  shareLinkId: number;
  shareToken: string;
}

interface Req {
  method?: string;
  path: string;
  json?: unknown;
}

interface Expectation {
  /** Minimum role for own-crew access; "any" = any signed-in caller. */
  min: Role | "any";
  /** What another crew's record answers: 404, or "filtered" (2xx, the other crew's data left out). */
  other?: 404 | "filtered";
  /** Allowed statuses besides 2xx (the route's documented non-error). */
  ok?: number[];
  /** Builds the request against a crew's fixture; may create a throwaway record first. */
  req: (f: Fixture) => Req | Promise<Req>;
  /** After an allowed call the crew's runs are being read again: wait until they are ready. */
  settle?: boolean;
  /** Extra check of an allowed answer. */
  check?: (body: string, side: CrewSide) => void;
}

const hex = randomBytes(3).toString("hex");
const loop = demoCrew.routePlans[0].waypoints;
const csv = (seed: number) => toCsv(simulateRun({ seed, waypoints: loop, hz: 5 }));
const waypoints = [
  { name: "A", lat: 53.47, lon: -3.05 },
  { name: "B", lat: 53.471, lon: -3.051 },
];
const mapping = { columns: [{ header: "time_s", field: "time", unit: "s" }, { header: "latitude", field: "lat" }, { header: "longitude", field: "lon" }] };
const channels = Array.from({ length: 18 }, (_, i) => ({ channel: i + 1, function: "unused" }));
const png = tinyPng();

async function json<T>(res: Response, status: number): Promise<T> {
  const text = await res.text();
  expect(res.status, text).toBe(status);
  return JSON.parse(text) as T;
}

/** Throwaway records for destructive cells, made by the crew's own lead. */
async function throwawayShareLink(f: Fixture): Promise<number> {
  return (await json<{ id: number }>(await f.lead.post(`/api/runs/${f.runId}/share-links`, { expiresInDays: 1 }), 201)).id;
}
async function throwawayPhoto(f: Fixture): Promise<number> {
  return (await json<{ photoId: number }>(await f.lead.post(`/api/builds/${f.buildId}/photos`, { fileName: "t.png", contentType: "image/png", size: png.length }), 201)).photoId;
}

const crewQ = (f: Fixture) => `crewId=${f.crewId}`;

/** `METHOD /api/path/[param]` → who may call it and what a valid request is. Mirrors README's API table. */
const expectations: Record<string, Expectation> = {
  "GET /api/me": { min: "any", other: "filtered", req: () => ({ path: "/api/me" }) },

  "GET /api/crews/[crewId]/members": { min: "observer", req: (f) => ({ path: `/api/crews/${f.crewId}/members` }) },
  "GET /api/crews/[crewId]/invitations": { min: "lead", req: (f) => ({ path: `/api/crews/${f.crewId}/invitations` }) },
  "POST /api/crews/[crewId]/invitations": {
    min: "lead",
    req: (f) => ({ method: "POST", path: `/api/crews/${f.crewId}/invitations`, json: { email: uniqueEmail("matrix-invitee"), role: "observer" } }),
  },
  "GET /api/crews/[crewId]/thresholds": { min: "observer", req: (f) => ({ path: `/api/crews/${f.crewId}/thresholds` }) },
  "PUT /api/crews/[crewId]/thresholds": { min: "lead", req: (f) => ({ method: "PUT", path: `/api/crews/${f.crewId}/thresholds`, json: {} }) },
  "GET /api/crews/[crewId]/audit": { min: "lead", req: (f) => ({ path: `/api/crews/${f.crewId}/audit` }) },
  "POST /api/crews/[crewId]/reanalyse": { min: "lead", settle: true, req: (f) => ({ method: "POST", path: `/api/crews/${f.crewId}/reanalyse` }) },

  "GET /api/builds": { min: "observer", req: (f) => ({ path: `/api/builds?${crewQ(f)}` }) },
  "POST /api/builds": { min: "lead", req: (f) => ({ method: "POST", path: "/api/builds", json: { crewId: f.crewId, name: "Matrix build", vehicleType: "ground" } }) },
  "GET /api/builds/[id]": { min: "observer", req: (f) => ({ path: `/api/builds/${f.buildId}` }) },
  "PUT /api/builds/[id]": { min: "lead", req: (f) => ({ method: "PUT", path: `/api/builds/${f.buildId}`, json: { notes: "checked by the matrix" } }) },
  // A changed sheet re-analyses the build's runs (the pilot's run is on this build).
  "PUT /api/builds/[id]/link-sheet": { min: "lead", settle: true, req: (f) => ({ method: "PUT", path: `/api/builds/${f.buildId}/link-sheet`, json: { channels } }) },
  "GET /api/builds/[id]/bench-tests": { min: "observer", req: (f) => ({ path: `/api/builds/${f.buildId}/bench-tests` }) },
  // The pilot's run is on the fixture build; it is given the bench summary of the analysis contract.
  "POST /api/builds/[id]/bench-tests": {
    min: "lead",
    req: async (f) => {
      await markAsBenchRun(f.pilotRunId);
      return { method: "POST", path: `/api/builds/${f.buildId}/bench-tests`, json: { runId: f.pilotRunId, note: "matrix" } };
    },
  },
  "GET /api/builds/[id]/check": { min: "observer", req: (f) => ({ path: `/api/builds/${f.buildId}/check` }) },
  "GET /api/builds/[id]/history": { min: "observer", req: (f) => ({ path: `/api/builds/${f.buildId}/history` }) },
  "POST /api/builds/[id]/retire": { min: "lead", req: (f) => ({ method: "POST", path: `/api/builds/${f.buildId}/retire`, json: { retired: false } }) },
  "GET /api/builds/[id]/photos": { min: "observer", req: (f) => ({ path: `/api/builds/${f.buildId}/photos` }) },
  "POST /api/builds/[id]/photos": {
    min: "lead",
    req: (f) => ({ method: "POST", path: `/api/builds/${f.buildId}/photos`, json: { fileName: "p.png", contentType: "image/png", size: png.length } }),
  },
  // The fixture photo is stored already, so completing it again is an idempotent 200.
  "POST /api/builds/[id]/photos/[photoId]/complete": { min: "lead", req: (f) => ({ method: "POST", path: `/api/builds/${f.buildId}/photos/${f.photoId}/complete` }) },
  "DELETE /api/builds/[id]/photos/[photoId]": {
    min: "lead",
    req: async (f) => ({ method: "DELETE", path: `/api/builds/${f.buildId}/photos/${await throwawayPhoto(f)}` }),
  },

  "GET /api/route-plans": { min: "observer", req: (f) => ({ path: `/api/route-plans?${crewQ(f)}` }) },
  "POST /api/route-plans": { min: "pilot", req: (f) => ({ method: "POST", path: "/api/route-plans", json: { crewId: f.crewId, name: "Matrix plan", waypoints } }) },
  "GET /api/route-plans/[id]": { min: "observer", req: (f) => ({ path: `/api/route-plans/${f.planId}` }) },

  "GET /api/column-maps": { min: "observer", req: (f) => ({ path: `/api/column-maps?${crewQ(f)}` }) },
  "POST /api/column-maps": { min: "pilot", req: (f) => ({ method: "POST", path: "/api/column-maps", json: { crewId: f.crewId, name: `Matrix map ${randomBytes(3).toString("hex")}`, mapping } }) },

  "POST /api/uploads": {
    min: "pilot",
    req: (f) => ({ method: "POST", path: "/api/uploads", json: { crewId: f.crewId, fileName: "matrix.csv", size: 100, contentType: "text/csv" } }),
  },
  // The pilot's own, already completed upload: completing again answers its run (the uploader or a lead).
  "POST /api/uploads/[id]/complete": { min: "pilot", req: (f) => ({ method: "POST", path: `/api/uploads/${f.uploadId}/complete` }) },

  "GET /api/runs/status": {
    min: "observer",
    other: "filtered",
    req: (f) => ({ path: `/api/runs/status?ids=${f.runId}` }),
    check: (body, side) => expect((JSON.parse(body) as { runs: unknown[] }).runs).toHaveLength(side === "own" ? 1 : 0),
  },
  "GET /api/runs/[id]": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}` }) },
  "GET /api/runs/[id]/series": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/series?fields=rssiDbm,altM&points=100` }) },
  "GET /api/runs/[id]/track": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/track` }) },
  "GET /api/runs/[id]/points": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/points?fields=rssiDbm,distanceFromHomeM&points=50` }) },
  "GET /api/runs/[id]/report.pdf": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/report.pdf` }) },
  "GET /api/runs/[id]/export/track.gpx": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/export/track.gpx` }) },
  "GET /api/runs/[id]/export/track.geojson": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/export/track.geojson` }) },
  "GET /api/runs/[id]/export/events.csv": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/export/events.csv` }) },
  "GET /api/runs/[id]/preview": { min: "observer", req: (f) => ({ path: `/api/runs/${f.runId}/preview` }) },
  "GET /api/runs/[id]/original": { min: "observer", ok: [302], req: (f) => ({ path: `/api/runs/${f.runId}/original` }) },
  // The run's pilot or a lead: the pilot's own run. Same build again = no re-read.
  "PUT /api/runs/[id]/build": { min: "pilot", settle: true, req: (f) => ({ method: "PUT", path: `/api/runs/${f.pilotRunId}/build`, json: { buildId: f.buildId } }) },
  "POST /api/runs/[id]/reparse": { min: "pilot", settle: true, req: (f) => ({ method: "POST", path: `/api/runs/${f.pilotRunId}/reparse` }) },
  "GET /api/runs/[id]/share-links": { min: "lead", req: (f) => ({ path: `/api/runs/${f.runId}/share-links` }) },
  "POST /api/runs/[id]/share-links": { min: "lead", req: (f) => ({ method: "POST", path: `/api/runs/${f.runId}/share-links`, json: { expiresInDays: 1 } }) },
  "DELETE /api/share-links/[id]": { min: "lead", req: async (f) => ({ method: "DELETE", path: `/api/share-links/${await throwawayShareLink(f)}` }) },
};

/** Routes without a session check, each with its own test below. */
const publicRoutes = new Set([
  "GET /api/health",
  "GET /api/auth/[...nextauth]",
  "POST /api/auth/[...nextauth]",
  "GET /api/share/[token]/series",
  "GET /api/share/[token]/track",
  "GET /api/share/[token]/points",
]);

/** What a cell must answer. */
function expected(e: Expectation, who: Who, side: CrewSide): "allowed" | 401 | 403 | 404 {
  if (who === "anon") return 401;
  if (side === "other" && e.other !== "filtered") return 404;
  if (e.min === "any" || rank[who] >= rank[e.min]) return "allowed";
  return 403;
}

// ---- The matrix ------------------------------------------------------------------------------

describe("authorisation matrix (ASVS V4.1.1, V4.1.3, V4.2.1)", () => {
  const clients: Record<Who, Client> = { anon: new Client(), observer: new Client(), pilot: new Client(), lead: new Client() };
  let A: Fixture;
  let B: Fixture;
  let pilotToken: string;
  /** Crew B's data that must never reach a caller from crew A or a signed-out caller. */
  let secretsOfB: string[] = [];
  const summary = new Map<string, string[]>();

  function assertNoLeak(text: string, where: string) {
    for (const s of secretsOfB) expect(text.includes(s), `${where} shows crew B's ${JSON.stringify(s)}`).toBe(false);
  }

  async function waitReady(c: Client, ids: number[]) {
    for (const id of ids) expect((await settledRun(c, id)).status).toBe("ready");
  }

  async function joinCrew(lead: Awaited<ReturnType<typeof newLead>>, role: Role, client: Client) {
    const email = uniqueEmail(`matrix-${role}`);
    await json(await clients.lead.post(`/api/crews/${lead.crewId}/invitations`, { email, role }), 201);
    const token = tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/"));
    const joined = await acceptInvitation(token, { name: `Matrix ${role}`, password: testPassword });
    expect(await client.signIn(email, testPassword)).toBeNull();
    return joined;
  }

  /** Build, stored photo, route plan, column map, share link: the records routes need ids of. */
  async function records(c: Client, crewId: number, label: string) {
    const buildId = (await json<{ id: number }>(await c.post("/api/builds", { crewId, name: `${label} build ${hex}`, vehicleType: "ground" }), 201)).id;
    const photo = await json<{ photoId: number; putUrl: string }>(await c.post(`/api/builds/${buildId}/photos`, { fileName: "rover.png", contentType: "image/png", size: png.length }), 201);
    expect((await fetch(photo.putUrl, { method: "PUT", body: new Uint8Array(png), headers: { "content-type": "image/png" } })).status).toBe(200);
    await json(await c.post(`/api/builds/${buildId}/photos/${photo.photoId}/complete`, {}), 200);
    const planId = (await json<{ id: number }>(await c.post("/api/route-plans", { crewId, name: `${label} plan ${hex}`, waypoints }), 201)).id;
    const columnMapId = (await json<{ id: number }>(await c.post("/api/column-maps", { crewId, name: `${label} map ${hex}`, mapping }), 201)).id;
    return { buildId, photoId: photo.photoId, planId, columnMapId };
  }

  async function shareOf(c: Client, runId: number) {
    const link = await json<{ id: number; url: string }>(await c.post(`/api/runs/${runId}/share-links`, { expiresInDays: 7 }), 201);
    return { shareLinkId: link.id, shareToken: new URL(link.url).pathname.split("/").pop()! };
  }

  beforeAll(async () => {
    // Crew A: a lead who invites a pilot and an observer.
    const leadA = await newLead("matrix-alpha", `Matrix alpha crew ${hex}`);
    expect(await clients.lead.signIn(leadA.email, testPassword)).toBeNull();
    const pilotJoined = await joinCrew(leadA, "pilot", clients.pilot);
    await joinCrew(leadA, "observer", clients.observer);
    const recA = await records(clients.lead, leadA.crewId, "Alpha");
    const upA = await uploadLog(clients.lead, `alpha-run-${hex}.csv`, csv(31), { crewId: leadA.crewId });
    const upP = await uploadLog(clients.pilot, `alpha-pilot-run-${hex}.csv`, csv(32), { crewId: leadA.crewId, buildId: recA.buildId });
    await waitReady(clients.lead, [upA.runId, upP.runId]);
    A = { crewId: leadA.crewId, lead: clients.lead, runId: upA.runId, pilotRunId: upP.runId, uploadId: upP.uploadId, ...recA, ...(await shareOf(clients.lead, upA.runId)) };
    const pilotUser = (await getUserById(pilotJoined.userId))!;
    pilotToken = (await createApiToken({ user: pilotUser, via: "session" }, "matrix laptop")).token;

    // Crew B: its own lead, a run, a build, a plan, a column map, a share link and an open invitation.
    const leadB = await newLead("matrix-bravo", `Bravo secret crew ${hex}`);
    const cB = new Client();
    expect(await cB.signIn(leadB.email, testPassword)).toBeNull();
    const recB = await records(cB, leadB.crewId, "Bravo hidden");
    const bTitle = `bravo-secret-run-${hex}`;
    const upB = await uploadLog(cB, `${bTitle}.csv`, csv(33), { crewId: leadB.crewId, buildId: recB.buildId });
    await waitReady(cB, [upB.runId]);
    const inviteeB = uniqueEmail("bravo-invitee");
    await json(await cB.post(`/api/crews/${leadB.crewId}/invitations`, { email: inviteeB, role: "pilot" }), 201);
    B = { crewId: leadB.crewId, lead: cB, runId: upB.runId, pilotRunId: upB.runId, uploadId: upB.uploadId, ...recB, ...(await shareOf(cB, upB.runId)) };
    const runB = (await json<{ run: { title: string } }>(await cB.get(`/api/runs/${upB.runId}`), 200)).run;
    expect(runB.title).toBe(bTitle);
    secretsOfB = [bTitle, `Bravo hidden build ${hex}`, `Bravo hidden plan ${hex}`, `Bravo hidden map ${hex}`, `Bravo secret crew ${hex}`, leadB.email, inviteeB, B.shareToken, `crews/${B.crewId}/`];
  }, 120_000);

  afterAll(() => {
    if (!summary.size) return;
    const head = ["route".padEnd(52), ...WHO.map((w) => `own:${w}`.padEnd(13)), ...WHO.map((w) => `other:${w}`.padEnd(15))].join("");
    const lines = [...summary].sort(([a], [b]) => a.localeCompare(b)).map(([k, cells]) => k.padEnd(52) + cells.map((c, i) => c.padEnd(i < 4 ? 13 : 15)).join(""));
    console.log(`access matrix: ${summary.size} routes × ${WHO.length} callers × 2 crews = ${summary.size * WHO.length * 2} cells\n${head}\n${lines.join("\n")}`);
  });

  it("has an expectation for every route handler, and none for a route that is gone", () => {
    expect(discovered.length).toBeGreaterThan(30);
    for (const key of discovered) {
      if (!publicRoutes.has(key) && !expectations[key]) expect.fail(`no expectation for ${key}`);
    }
    for (const key of [...Object.keys(expectations), ...publicRoutes]) expect(discovered, `stale expectation for ${key}`).toContain(key);
  });

  for (const key of discovered.filter((k) => expectations[k])) {
    it(key, async () => {
      const e = expectations[key];
      const cells: string[] = [];
      for (const side of ["own", "other"] as const) {
        for (const who of WHO) {
          const f = side === "own" ? A : B;
          const r = await e.req(f);
          const res = await clients[who].request(r.path, { method: r.method ?? "GET", json: r.json });
          const body = await res.text();
          const where = `${key} as ${who} (${side} crew) → ${res.status}`;
          const want = expected(e, who, side);
          if (want === "allowed") {
            expect((res.status >= 200 && res.status < 300) || (e.ok ?? []).includes(res.status), `${where}: ${body.slice(0, 300)}`).toBe(true);
            e.check?.(body, side);
            if (e.settle && side === "own") await waitReady(A.lead, [A.runId, A.pilotRunId]);
          } else {
            expect(res.status, `${where}: ${body.slice(0, 300)}`).toBe(want);
            expect((JSON.parse(body) as { error?: { code?: string } }).error?.code, where).toBeTruthy();
          }
          // V4.2.1: nothing of crew B in the body or the headers (a redirect's Location included).
          assertNoLeak(body + "\n" + [...res.headers].map(([k, v]) => `${k}: ${v}`).join("\n"), where);
          cells.push(String(res.status));
        }
      }
      summary.set(key, cells);
    });
  }

  // ---- Bearer tokens -------------------------------------------------------------------------

  it("an API token of crew A's pilot acts as that pilot and cannot reach crew B", async () => {
    const bearer = new Client(pilotToken);
    const cases: [Req, number][] = [
      [{ path: "/api/me" }, 200],
      [{ path: `/api/runs/${A.runId}` }, 200],
      [{ path: `/api/builds/${A.buildId}` }, 200],
      [{ path: `/api/runs/${A.runId}/series?fields=rssiDbm&points=50` }, 200],
      [{ method: "POST", path: "/api/route-plans", json: { crewId: A.crewId, name: "Token plan", waypoints } }, 201],
      [{ method: "POST", path: "/api/builds", json: { crewId: A.crewId, name: "Token build", vehicleType: "boat" } }, 403],
      [{ path: `/api/crews/${A.crewId}/invitations` }, 403],
      [{ path: `/api/runs/${A.runId}/share-links` }, 403],
      [{ path: `/api/runs/${B.runId}` }, 404],
      [{ path: `/api/runs/${B.runId}/original` }, 404],
      [{ path: `/api/builds/${B.buildId}` }, 404],
      [{ path: `/api/route-plans/${B.planId}` }, 404],
      [{ path: `/api/crews/${B.crewId}/members` }, 404],
      [{ path: `/api/column-maps?crewId=${B.crewId}` }, 404],
      [{ method: "POST", path: "/api/route-plans", json: { crewId: B.crewId, name: "Token intruder", waypoints } }, 404],
      [{ method: "POST", path: "/api/uploads", json: { crewId: B.crewId, fileName: "x.csv", size: 10, contentType: "text/csv" } }, 404],
      [{ method: "POST", path: `/api/uploads/${B.uploadId}/complete` }, 404],
    ];
    for (const [r, status] of cases) {
      const res = await bearer.request(r.path, { method: r.method ?? "GET", json: r.json });
      const body = await res.text();
      expect(res.status, `bearer ${r.method ?? "GET"} ${r.path}: ${body.slice(0, 200)}`).toBe(status);
      assertNoLeak(body, `bearer ${r.path}`);
    }
    expect((JSON.parse((await (await bearer.get("/api/me")).text())) as { via: string }).via).toBe("api-token");
  });

  // ---- Public routes -------------------------------------------------------------------------

  it("public: GET /api/health answers without a session and shows no crew data", async () => {
    const res = await clients.anon.get("/api/health");
    const body = await res.text();
    expect(res.status).toBe(200);
    expect(JSON.parse(body)).toEqual({ ok: true, database: true, objectStore: true });
    assertNoLeak(body, "health");
  });

  it("public: /api/auth/* gives a signed-out caller no session and a member only their own", async () => {
    const anon = new Client();
    for (const p of ["/api/auth/csrf", "/api/auth/providers", "/api/auth/session"]) {
      const res = await anon.get(p);
      const body = await res.text();
      expect(res.status, p).toBe(200);
      assertNoLeak(body, p);
    }
    const anonSession = (await (await anon.get("/api/auth/session")).json()) as { user?: unknown };
    expect(anonSession.user).toBeUndefined();
    // A wrong password signs nobody in (POST /api/auth/callback/credentials).
    expect(await anon.signIn(secretsOfB.find((s) => s.includes("@"))!, "wrong password")).not.toBeNull();
    for (const who of ["observer", "pilot", "lead"] as const) {
      const res = await clients[who].get("/api/auth/session");
      const body = await res.text();
      expect(res.status).toBe(200);
      expect((JSON.parse(body) as { user?: { email?: string } }).user?.email).toMatch(/@crew\.example$/);
      assertNoLeak(body, `session of ${who}`);
    }
  });

  it("public: a share token of crew B's run only ever returns that run's data; bad, malformed and revoked tokens 404", async () => {
    const queries = { series: "?fields=rssiDbm,altM&points=100", track: "", points: "?fields=rssiDbm,distanceFromHomeM&points=50" };
    const revokedToken = await (async () => {
      const link = await json<{ id: number; url: string }>(await B.lead.post(`/api/runs/${B.runId}/share-links`, { expiresInDays: 1 }), 201);
      await json(await B.lead.request(`/api/share-links/${link.id}`, { method: "DELETE" }), 200);
      return new URL(link.url).pathname.split("/").pop()!;
    })();
    const emailsOfB = secretsOfB.filter((s) => s.includes("@"));
    for (const [kind, q] of Object.entries(queries)) {
      const viaToken = await clients.anon.get(`/api/share/${B.shareToken}/${kind}${q}`);
      const shared = await viaToken.text();
      expect(viaToken.status, `${kind}: ${shared.slice(0, 200)}`).toBe(200);
      const own = await (await B.lead.get(`/api/runs/${B.runId}/${kind}${q}`)).text();
      const ofA = await (await A.lead.get(`/api/runs/${A.runId}/${kind}${q}`)).text();
      // The same body as the run's own route, and not crew A's run.
      expect(JSON.parse(shared)).toEqual(JSON.parse(own));
      expect(shared).not.toEqual(ofA);
      for (const e of emailsOfB) expect(shared).not.toContain(e);
      // A signed-in member of crew A gets the same single run through the token, nothing more.
      const asA = await clients.lead.get(`/api/share/${B.shareToken}/${kind}${q}`);
      expect(asA.status).toBe(200);
      expect(JSON.parse(await asA.text())).toEqual(JSON.parse(own));
      for (const bad of [randomBytes(32).toString("base64url"), "not-a-token", revokedToken, `${B.shareToken}x`]) {
        const res = await clients.anon.get(`/api/share/${encodeURIComponent(bad)}/${kind}${q}`);
        const body = await res.text();
        expect(res.status, `${kind} with ${bad}`).toBe(404);
        assertNoLeak(body, `share ${kind} bad token`);
      }
    }
  });
});
