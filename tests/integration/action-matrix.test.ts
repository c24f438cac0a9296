/**
 * The server-action authorisation matrix: every server action (found twice — in the production
 * build's server-reference-manifest.json and by reading the "use server" files' exports) × every
 * caller (signed out, observer, pilot, lead) × the caller's own crew and another crew, called over
 * HTTP the way the browser calls it (POST to the page with `Next-Action`, the argument list
 * encoded by React's encodeReply) against the running test build. It complements
 * access-matrix.test.ts, which covers the API route handlers.
 *
 * OWASP ASVS 4.0.3:
 * - V4.1.1 — access control is enforced on the trusted service layer: every cell is an HTTP call to
 *   the action endpoint, never a hidden button; the form's own fields (crewId, runId, userId…) are
 *   attacker-controlled and are sent as such.
 * - V4.1.3 — least privilege: a member below an action's minimum role gets "Your role in this crew
 *   does not allow that", a signed-out caller "Sign in to continue", and nothing changes.
 * - V4.2.1 — insecure direct object references: another crew's crew, run, member, invitation and
 *   another user's API token answer "… not found" (never a forbidden-with-details), foreign ids in a
 *   user-scoped form are ignored, crew B's records are re-read after every cell and must be
 *   unchanged, and no crew B data (name, e-mails, run title) appears in any answer.
 * - V4.2.2 — cross-site request forgery: an action posted with a foreign Origin is refused.
 * - V3.5.2 / V3.5.3 — forms act on the browser session only: an API token cannot drive them, and a
 *   tampered session cookie counts as signed out. V3.3.1 — sign-out ends the session on the server: a
 *   copied cookie is refused afterwards. A member removed from the crew loses access
 *   with the session they already hold (V4.1.1: checks run on every call, not at sign-in).
 *
 * An action that is not in `expectations` fails "no expectation for <file>#<name>", and the build's
 * manifest and the source must list the same actions, so a new action cannot ship without its row.
 */
import { randomBytes } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { and, eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { getUserById } from "@/db/queries/users";
import { apiTokens, benchTests, builds, crews, invitations, memberships, passwordResets, runNotes, runs, users, type Role } from "@/db/schema";
import { createApiToken } from "@/lib/api-tokens";
import { hashToken, newToken } from "@/lib/auth/secrets";
import { acceptInvitation } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { markAsBenchRun } from "../helpers/bench-log";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { callAction, formOf, manifestActions, pagePath, type ActionResult } from "../helpers/server-action";
import { settledRun, uploadLog } from "../helpers/uploads";

// ---- Action discovery ------------------------------------------------------------------------

const root = process.cwd();

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    if (e.isDirectory()) return e.name === "node_modules" ? [] : sourceFiles(p);
    return /\.(ts|tsx|js|mjs)$/.test(e.name) ? [p] : [];
  });
}

/** `file#name` of every export of a file that starts with the "use server" directive. */
function sourceActions(): string[] {
  const found: string[] = [];
  for (const dir of ["app", "components", "lib"]) {
    for (const file of sourceFiles(join(root, dir))) {
      const src = readFileSync(file, "utf8");
      if (!src.includes("use server")) continue;
      const rel = relative(root, file).split(sep).join("/");
      // The directive must be the first statement (comments aside) to make every export an action.
      const body = src.replace(/^(\s*(\/\/[^\n]*\n|\/\*[\s\S]*?\*\/))*\s*/, "");
      if (!/^["']use server["']/.test(body)) {
        // An inline action inside a component: it has no export to read, so force a decision.
        found.push(`${rel}#<inline "use server">`);
        continue;
      }
      for (const m of src.matchAll(/export\s+(?:async\s+function\s*\*?|(?:const|let)\s+)\s*([A-Za-z_$][\w$]*)/g)) found.push(`${rel}#${m[1]}`);
      for (const m of src.matchAll(/export\s*\{([^}]*)\}/g)) {
        for (const part of m[1].split(",")) {
          const name = part.trim().split(/\s+as\s+/).pop()?.trim();
          if (name) found.push(`${rel}#${name}`);
        }
      }
    }
  }
  return [...new Set(found)].sort();
}

const manifest = manifestActions();
const byKey = new Map(manifest.map((a) => [`${a.filename}#${a.exportedName}`, a]));
const fromManifest = [...byKey.keys()].sort();
const fromSource = sourceActions();

// ---- Fixtures --------------------------------------------------------------------------------

type Who = "anon" | Role;
type CrewSide = "own" | "other";
const WHO: Who[] = ["anon", "observer", "pilot", "lead"];
const rank: Record<Role, number> = { observer: 1, pilot: 2, lead: 3 };

interface Member {
  userId: number;
  email: string;
}

interface CrewFixture {
  crewId: number;
  runId: number;
  lead: Member;
}

/** Everything a cell needs: who calls, against which crew, and per-cell data from `prepare`. */
interface Cell {
  who: Who;
  side: CrewSide;
  /** The crew the form points at: A (own) or B (other). */
  f: CrewFixture;
  /** The caller (crew A's member), null when signed out. */
  me: Member | null;
  /** Unique per cell, so records it makes can be found again. */
  tag: string;
  data: Record<string, string | number>;
}

type Fields = Record<string, string | number | undefined>;

/** What a cell must answer: the action went through, a FormState refusal with this message, a thrown error, or a redirect. */
type Outcome = { ok: true; redirect?: string; message?: RegExp } | { refused: string | RegExp } | { thrown: true };

interface Expectation {
  /**
   * Minimum role in the target crew; "any" = any signed-in caller (the action acts on the caller
   * itself); "public" = no session needed, outcome given by `outcome`.
   */
  min: Role | "any" | "public";
  /** What a crew B target answers: its "… not found" message, or "ignored" (user-scoped: foreign ids in the form have no effect). */
  other: string | "ignored";
  /** `[formData]` instead of useActionState's `[prevState, formData]`; failures throw (production hides the message). */
  plainForm?: true;
  /** Outcome of a public action. */
  outcome?: (c: Cell) => Outcome;
  prepare?: (c: Cell) => Promise<void>;
  form: (c: Cell) => Fields;
  /** Values for the page path's [params]. */
  params?: (c: Cell) => Record<string, string | number>;
  /** The state an allowed call changes and a refused one must leave as it was. */
  state?: (c: Cell) => Promise<unknown>;
  /** After an allowed call: the change is there. */
  applied?: (c: Cell, after: unknown, r: ActionResult) => void;
  /** Any further check of the answer. */
  check?: (c: Cell, r: ActionResult, allowed: boolean) => void;
  cleanup?: (c: Cell) => Promise<void>;
}

const hex = randomBytes(3).toString("hex");
const loop = demoCrew.routePlans[0].waypoints;
const csv = (seed: number) => toCsv(simulateRun({ seed, waypoints: loop, hz: 5 }));
const later = (days: number) => new Date(Date.now() + days * 24 * 3600 * 1000);

const FORBIDDEN = "Your role in this crew does not allow that";
const SIGN_IN = "Sign in to continue";
const SPENT_INVITATION = "This invitation has expired, was revoked or was already used; ask the crew lead for a new one";
const SPENT_RESET = "This reset link has expired or was already used; ask for a new one";

/** A user straight in the database (no password needed: they never sign in), optionally a crew member. */
async function insertUser(label: string, crewId?: number, role: Role = "observer"): Promise<Member> {
  const email = uniqueEmail(label);
  const [{ id }] = await db().insert(users).values({ email, name: `Matrix ${label}`, passwordHash: "x" }).$returningId();
  if (crewId) await db().insert(memberships).values({ crewId, userId: id, role });
  return { userId: id, email };
}

async function insertInvitation(crewId: number, email: string, opts: { revoked?: boolean } = {}) {
  const token = newToken();
  const [{ id }] = await db()
    .insert(invitations)
    .values({ crewId, email, role: "pilot", tokenHash: hashToken(token), expiresAt: later(7), revokedAt: opts.revoked ? new Date() : null })
    .$returningId();
  return { id, token };
}

async function roleOf(crewId: number, userId: number): Promise<Role | null> {
  const [m] = await db().select({ role: memberships.role }).from(memberships).where(and(eq(memberships.crewId, crewId), eq(memberships.userId, userId)));
  return m?.role ?? null;
}

async function userRow(userId: number) {
  const [u] = await db().select({ name: users.name, units: users.units, alertEmails: users.alertEmails, passwordHash: users.passwordHash }).from(users).where(eq(users.id, userId));
  return u;
}

let A: CrewFixture;
let B: CrewFixture;
/** A's members by role, for the cells' callers. */
const members = {} as Record<Role, Member>;
/** Crew B records the "other" cells aim at. */
let bMember: Member;
let bTokenId: number;
let bSpentResetToken: string;
let bRevokedInvitationToken: string;

/** `file#exportedName` → who may call it and what a valid call is. */
const expectations: Record<string, Expectation> = {
  "app/(app)/actions.ts#switchCrewAction": {
    min: "any",
    other: "Crew not found",
    plainForm: true,
    form: (c) => ({ crewId: c.f.crewId }),
    check: (c, r, allowed) => {
      const cookie = r.headers.getSetCookie().find((s) => s.startsWith("sortie-crew="));
      if (allowed) expect(cookie, "crew cookie").toMatch(new RegExp(`^sortie-crew=${A.crewId};.*HttpOnly`, "i"));
      else expect(cookie, "a refused switch sets no crew cookie").toBeUndefined();
    },
  },

  "app/(app)/builds/actions.ts#createBuildAction": {
    min: "lead",
    other: "Crew not found",
    form: (c) => ({ crewId: c.f.crewId, name: `Matrix build ${c.tag}`, vehicleType: "ground", bandMhz: "2400" }),
    state: async (c) => db().select({ crewId: builds.crewId }).from(builds).where(eq(builds.name, `Matrix build ${c.tag}`)),
    applied: (c, after) => expect(after).toEqual([{ crewId: A.crewId }]),
  },

  // On the debrief of a bench run: the crew's run, attached to a fresh build and given the bench
  // summary of the analysis contract (the analysis itself is not under test here).
  "app/(app)/builds/actions.ts#recordBenchTestAction": {
    min: "lead",
    other: "Build not found",
    prepare: async (c) => {
      const [{ id }] = await db().insert(builds).values({ crewId: c.f.crewId, name: `Matrix bench build ${c.tag}`, vehicleType: "multirotor" }).$returningId();
      await db().update(runs).set({ buildId: id }).where(eq(runs.id, c.f.runId));
      await markAsBenchRun(c.f.runId);
      c.data.buildId = id;
    },
    params: (c) => ({ runId: c.f.runId }),
    form: (c) => ({ runId: c.f.runId, buildId: c.data.buildId, note: `matrix ${c.tag}` }),
    state: async (c) => db().select({ buildId: benchTests.buildId, note: benchTests.note }).from(benchTests).where(eq(benchTests.runId, c.f.runId)),
    applied: (c, after) => expect(after).toEqual([{ buildId: Number(c.data.buildId), note: `matrix ${c.tag}` }]),
  },

  "app/(app)/crew/actions.ts#inviteMemberAction": {
    min: "lead",
    other: "Crew not found",
    form: (c) => ({ crewId: c.f.crewId, email: `matrix-invitee-${c.tag}@crew.example`, role: "lead" }),
    state: async (c) => db().select({ crewId: invitations.crewId }).from(invitations).where(eq(invitations.email, `matrix-invitee-${c.tag}@crew.example`)),
    applied: (c, after) => expect(after).toEqual([{ crewId: A.crewId }]),
  },
  "app/(app)/crew/actions.ts#changeRoleAction": {
    min: "lead",
    other: "Crew not found",
    prepare: async (c) => {
      c.data.target = (await insertUser(`target-${c.tag}`, c.f.crewId, "observer")).userId;
    },
    // An escalation to lead: the change a forged form would want most.
    form: (c) => ({ crewId: c.f.crewId, userId: c.data.target, role: "lead" }),
    state: (c) => roleOf(c.f.crewId, Number(c.data.target)),
    applied: (c, after) => expect(after).toBe("lead"),
  },
  "app/(app)/crew/actions.ts#removeMemberAction": {
    min: "lead",
    other: "Crew not found",
    prepare: async (c) => {
      c.data.target = (await insertUser(`target-${c.tag}`, c.f.crewId, "pilot")).userId;
    },
    form: (c) => ({ crewId: c.f.crewId, userId: c.data.target }),
    state: (c) => roleOf(c.f.crewId, Number(c.data.target)),
    applied: (c, after) => expect(after).toBeNull(),
  },
  "app/(app)/crew/actions.ts#renameCrewAction": {
    min: "lead",
    other: "Crew not found",
    form: (c) => ({ crewId: c.f.crewId, name: `Matrix renamed ${c.tag}` }),
    state: async (c) => (await db().select({ name: crews.name }).from(crews).where(eq(crews.id, c.f.crewId)))[0].name,
    applied: (c, after) => expect(after).toBe(`Matrix renamed ${c.tag}`),
  },
  "app/(app)/crew/actions.ts#revokeInvitationAction": {
    min: "lead",
    other: "Invitation not found",
    prepare: async (c) => {
      c.data.invitationId = (await insertInvitation(c.f.crewId, uniqueEmail(`open-${c.tag}`))).id;
    },
    form: (c) => ({ invitationId: c.data.invitationId }),
    state: async (c) => (await db().select({ revokedAt: invitations.revokedAt }).from(invitations).where(eq(invitations.id, Number(c.data.invitationId))))[0].revokedAt !== null,
    applied: (c, after) => expect(after).toBe(true),
  },

  "app/(app)/runs/[runId]/actions.ts#addNoteAction": {
    min: "pilot",
    other: "Run not found",
    params: (c) => ({ runId: c.f.runId }),
    form: (c) => ({ runId: c.f.runId, body: `Matrix note ${c.tag}` }),
    state: async (c) => db().select({ runId: runNotes.runId }).from(runNotes).where(eq(runNotes.body, `Matrix note ${c.tag}`)),
    applied: (c, after) => expect(after).toEqual([{ runId: A.runId }]),
  },
  "app/(app)/runs/[runId]/actions.ts#signOffAction": {
    min: "lead",
    other: "Run not found",
    params: (c) => ({ runId: c.f.runId }),
    form: (c) => ({ runId: c.f.runId, intent: "sign" }),
    state: async (c) => (await db().select({ by: runs.signedOffBy }).from(runs).where(eq(runs.id, c.f.runId)))[0].by,
    applied: (c, after) => expect(after).toBe(c.me!.userId),
    cleanup: async () => {
      await db().update(runs).set({ signedOffBy: null, signedOffAt: null }).where(eq(runs.id, A.runId));
    },
  },

  // User-scoped: the "other" cell smuggles crew B's ids into the form; they must be ignored.
  "app/(app)/settings/actions.ts#createCrewAction": {
    min: "any",
    other: "ignored",
    form: (c) => ({ name: `Matrix new crew ${c.tag}`, crewId: c.side === "other" ? B.crewId : undefined }),
    state: async (c) =>
      db()
        .select({ userId: memberships.userId, role: memberships.role })
        .from(crews)
        .innerJoin(memberships, eq(memberships.crewId, crews.id))
        .where(eq(crews.name, `Matrix new crew ${c.tag}`)),
    applied: (c, after) => expect(after).toEqual([{ userId: c.me!.userId, role: "lead" }]),
  },
  "app/(app)/settings/actions.ts#updateProfileAction": {
    min: "any",
    other: "ignored",
    form: (c) => ({ name: `Matrix ${c.who} ${c.tag}`, units: "imperial", alertEmails: "on", ...(c.side === "other" ? { userId: B.lead.userId, id: B.lead.userId } : {}) }),
    state: async () => Promise.all(Object.values(members).map((m) => userRow(m.userId).then((u) => u.name))),
    applied: (c, after) => expect(after as string[]).toContain(`Matrix ${c.who} ${c.tag}`),
    cleanup: async (c) => {
      await db().update(users).set({ name: `Matrix ${c.who}`, units: "metric" }).where(eq(users.id, c.me!.userId));
    },
  },
  "app/(app)/settings/actions.ts#createApiTokenAction": {
    min: "any",
    other: "ignored",
    form: (c) => ({ name: `matrix token ${c.tag}`, ...(c.side === "other" ? { userId: B.lead.userId } : {}) }),
    state: async (c) => db().select({ userId: apiTokens.userId }).from(apiTokens).where(eq(apiTokens.name, `matrix token ${c.tag}`)),
    applied: (c, after, r) => {
      expect(after).toEqual([{ userId: c.me!.userId }]);
      expect((r.value as { result?: { token?: string } }).result?.token).toMatch(/^sortie_/);
    },
  },
  "app/(app)/settings/actions.ts#revokeApiTokenAction": {
    min: "any",
    other: "API token not found",
    prepare: async (c) => {
      if (c.side === "other") c.data.tokenId = bTokenId;
      else {
        // The caller's own token; signed out, crew A's lead's.
        const user = (await getUserById((c.me ?? members.lead).userId))!;
        c.data.tokenId = (await createApiToken({ user, via: "session" }, `revocable ${c.tag}`)).id;
      }
    },
    form: (c) => ({ tokenId: c.data.tokenId }),
    state: async (c) => (await db().select({ revokedAt: apiTokens.revokedAt }).from(apiTokens).where(eq(apiTokens.id, Number(c.data.tokenId))))[0].revokedAt !== null,
    applied: (c, after) => expect(after).toBe(true),
  },

  // Public: anyone may call them; the "other" cell aims at crew B's account or its spent links.
  "app/(auth)/sign-up/actions.ts#signUpAction": {
    min: "public",
    other: "ignored",
    outcome: (c) => (c.side === "own" ? { ok: true } : { refused: /^An account with this e-mail already exists/ }),
    form: (c) => ({
      name: "Matrix sign-up",
      email: c.side === "own" ? `matrix-signup-${c.tag}@crew.example` : B.lead.email,
      password: testPassword,
      crewName: `Matrix sign-up crew ${c.tag}`,
    }),
    state: async (c) => db().select({ id: crews.id }).from(crews).where(eq(crews.name, `Matrix sign-up crew ${c.tag}`)),
    applied: (c, after) => expect(after).toHaveLength(1),
  },
  "app/(auth)/forgot/actions.ts#forgotPasswordAction": {
    min: "public",
    other: "ignored",
    // The same answer whether or not the address has an account.
    outcome: () => ({ ok: true, message: /^If \S+ has a Sortie account, a reset link is on its way\. It works for one hour\.$/ }),
    form: (c) => ({ email: c.side === "other" ? B.lead.email : (c.me?.email ?? `matrix-nobody-${c.tag}@crew.example`) }),
  },
  "app/(auth)/reset/[token]/actions.ts#resetPasswordAction": {
    min: "public",
    other: "ignored",
    outcome: (c) => (c.side === "own" ? { ok: true, redirect: "/sign-in?reset=1" } : { refused: SPENT_RESET }),
    prepare: async (c) => {
      if (c.side === "other") {
        c.data.token = bSpentResetToken;
        c.data.userId = B.lead.userId;
        return;
      }
      const u = await insertUser(`reset-${c.tag}`);
      const token = newToken();
      await db().insert(passwordResets).values({ userId: u.userId, tokenHash: hashToken(token), expiresAt: later(1) });
      Object.assign(c.data, { token, userId: u.userId });
    },
    params: (c) => ({ token: c.data.token }),
    form: (c) => ({ token: c.data.token, password: testPassword, confirm: testPassword }),
    state: async (c) => (await userRow(Number(c.data.userId))).passwordHash,
    applied: (c, after) => expect(after).not.toBe("x"),
  },
  "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction": {
    min: "public",
    other: "ignored",
    // A valid link: a signed-out caller joins with a new account; a signed-in caller of another
    // address is refused (the link is not theirs). Crew B's revoked link: refused for everyone.
    outcome: (c) =>
      c.side === "other"
        ? { refused: SPENT_INVITATION }
        : c.who === "anon"
          ? { ok: true, message: /^Welcome aboard/ }
          : { refused: `This invitation was sent to ${c.data.email}; sign in with that address to accept it` },
    prepare: async (c) => {
      if (c.side === "other") {
        c.data.token = bRevokedInvitationToken;
        return;
      }
      c.data.email = `matrix-joiner-${c.tag}@crew.example`;
      const inv = await insertInvitation(A.crewId, String(c.data.email));
      Object.assign(c.data, { token: inv.token, invitationId: inv.id });
    },
    params: (c) => ({ token: c.data.token }),
    form: (c) => ({ token: c.data.token, ...(c.who === "anon" ? { name: "Matrix joiner", password: testPassword } : {}) }),
    state: async (c) =>
      c.side === "other"
        ? null
        : (await db().select({ acceptedAt: invitations.acceptedAt }).from(invitations).where(eq(invitations.id, Number(c.data.invitationId))))[0].acceptedAt !== null,
    applied: (c, after) => expect(after).toBe(true),
  },
};

/** What a cell must answer. */
function expected(e: Expectation, c: Cell): Outcome {
  if (e.min === "public") return e.outcome!(c);
  const refuse = (message: string): Outcome => (e.plainForm ? { thrown: true } : { refused: message });
  if (c.who === "anon") return refuse(SIGN_IN);
  if (c.side === "other" && e.other !== "ignored") return refuse(e.other);
  if (e.min === "any" || rank[c.who] >= rank[e.min]) return { ok: true };
  return refuse(FORBIDDEN);
}

/** The page the action is called on: the first page that uses it, [params] filled in from the cell. */
function pageFor(key: string, e: Expectation, c: Cell): string {
  const workers = byKey.get(key)!.workers.map(pagePath);
  const page = workers.find((w) => !w.includes("[")) ?? workers[0];
  const params = e.params?.(c) ?? {};
  return page.replace(/\[([^\]]+)\]/g, (_, name: string) => {
    if (!(name in params)) throw new Error(`${key}: no value for [${name}] in ${page}`);
    return encodeURIComponent(String(params[name]));
  });
}

// ---- The matrix ------------------------------------------------------------------------------

describe("server-action authorisation matrix (ASVS V4.1.1, V4.1.3, V4.2.1)", () => {
  const clients: Record<Who, Client> = { anon: new Client(), observer: new Client(), pilot: new Client(), lead: new Client() };
  let pilotToken: string;
  /** Crew B's data that must never reach a caller from crew A or a signed-out caller. */
  let secretsOfB: string[] = [];
  const summary = new Map<string, string[]>();

  function assertNoLeak(text: string, where: string, sent: Fields = {}) {
    // A value the caller typed into the form itself (e.g. an e-mail address) is not a leak.
    const own = Object.values(sent).map(String);
    for (const s of secretsOfB) if (!own.includes(s)) expect(text.includes(s), `${where} shows crew B's ${JSON.stringify(s)}`).toBe(false);
  }

  /** Crew B as the database has it: must be the same after every cell. */
  async function snapshotB() {
    const [crew] = await db().select({ name: crews.name }).from(crews).where(eq(crews.id, B.crewId));
    const crewMembers = await db().select({ userId: memberships.userId, role: memberships.role }).from(memberships).where(eq(memberships.crewId, B.crewId)).orderBy(memberships.userId);
    const invs = await db().select({ id: invitations.id, revokedAt: invitations.revokedAt, acceptedAt: invitations.acceptedAt }).from(invitations).where(eq(invitations.crewId, B.crewId)).orderBy(invitations.id);
    const bBuilds = await db().select({ id: builds.id }).from(builds).where(eq(builds.crewId, B.crewId));
    const [run] = await db().select({ title: runs.title, signedOffBy: runs.signedOffBy }).from(runs).where(eq(runs.id, B.runId));
    const notes = await db().select({ id: runNotes.id }).from(runNotes).where(eq(runNotes.runId, B.runId));
    const people = await Promise.all([B.lead.userId, bMember.userId].map(userRow));
    const tokens = await db().select({ id: apiTokens.id, revokedAt: apiTokens.revokedAt }).from(apiTokens).where(inArray(apiTokens.userId, [B.lead.userId, bMember.userId])).orderBy(apiTokens.id);
    return { crew, crewMembers, invs, bBuilds, run, notes, people, tokens };
  }

  async function joinCrew(crewId: number, role: Role, client: Client): Promise<Member> {
    const email = uniqueEmail(`action-${role}`);
    const res = await clients.lead.post(`/api/crews/${crewId}/invitations`, { email, role });
    expect(res.status, await res.text()).toBe(201);
    const token = tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/"));
    const joined = await acceptInvitation(token, { name: `Matrix ${role}`, password: testPassword });
    expect(await client.signIn(email, testPassword)).toBeNull();
    return { userId: joined.userId, email };
  }

  function cellFor(who: Who, side: CrewSide): Cell {
    return { who, side, f: side === "own" ? A : B, me: who === "anon" ? null : members[who], tag: randomBytes(4).toString("hex"), data: {} };
  }

  async function call(key: string, c: Cell, client: Client, opts: { origin?: string | null; headers?: Record<string, string> } = {}) {
    const e = expectations[key];
    const fields = e.form(c);
    const form = formOf(fields);
    const args = e.plainForm ? [form] : [{ status: "idle" }, form];
    const r = await callAction(client, byKey.get(key)!.id, args, { page: pageFor(key, e, c), ...opts });
    return { r, fields };
  }

  beforeAll(async () => {
    // Crew A: a lead who invites a pilot and an observer; one analysed run.
    const leadA = await newLead("action-alpha", `Action alpha crew ${hex}`);
    expect(await clients.lead.signIn(leadA.email, testPassword)).toBeNull();
    members.lead = { userId: leadA.userId, email: leadA.email };
    members.pilot = await joinCrew(leadA.crewId, "pilot", clients.pilot);
    members.observer = await joinCrew(leadA.crewId, "observer", clients.observer);
    const upA = await uploadLog(clients.lead, `action-alpha-run-${hex}.csv`, csv(41), { crewId: leadA.crewId });
    pilotToken = (await createApiToken({ user: (await getUserById(members.pilot.userId))!, via: "session" }, "action matrix laptop")).token;

    // Crew B: its lead, a pilot, a run, an open and a revoked invitation, an API token and a spent reset link.
    const leadB = await newLead("action-bravo", `Bravo secret crew ${hex}`);
    const cB = new Client();
    expect(await cB.signIn(leadB.email, testPassword)).toBeNull();
    const bTitle = `bravo-secret-run-${hex}`;
    const upB = await uploadLog(cB, `${bTitle}.csv`, csv(42), { crewId: leadB.crewId });
    expect((await settledRun(clients.lead, upA.runId)).status).toBe("ready");
    expect((await settledRun(cB, upB.runId)).status).toBe("ready");
    A = { crewId: leadA.crewId, runId: upA.runId, lead: members.lead };
    B = { crewId: leadB.crewId, runId: upB.runId, lead: { userId: leadB.userId, email: leadB.email } };
    bMember = await insertUser("bravo-pilot", B.crewId, "pilot");
    const inviteeB = uniqueEmail("bravo-invitee");
    await insertInvitation(B.crewId, inviteeB);
    bRevokedInvitationToken = (await insertInvitation(B.crewId, uniqueEmail("bravo-revoked"), { revoked: true })).token;
    bTokenId = (await createApiToken({ user: (await getUserById(leadB.userId))!, via: "session" }, "bravo laptop")).id;
    bSpentResetToken = newToken();
    await db().insert(passwordResets).values({ userId: leadB.userId, tokenHash: hashToken(bSpentResetToken), expiresAt: later(1), usedAt: new Date() });
    const [runB] = await db().select({ title: runs.title }).from(runs).where(eq(runs.id, upB.runId));
    expect(runB.title).toBe(bTitle);
    secretsOfB = [bTitle, `Bravo secret crew ${hex}`, leadB.email, bMember.email, inviteeB, "action-bravo lead"];
  }, 90_000);

  afterAll(() => {
    if (!summary.size) return;
    const head = ["action".padEnd(64), ...WHO.map((w) => `own:${w}`.padEnd(13)), ...WHO.map((w) => `other:${w}`.padEnd(15))].join("");
    const lines = [...summary].sort(([a], [b]) => a.localeCompare(b)).map(([k, cells]) => k.padEnd(64) + cells.map((c, i) => c.padEnd(i < 4 ? 13 : 15)).join(""));
    console.log(`action matrix: ${summary.size} actions × ${WHO.length} callers × 2 crews = ${summary.size * WHO.length * 2} cells\n${head}\n${lines.join("\n")}`);
  });

  it("has an expectation for every server action, the build and the source agree, and none is stale", () => {
    expect(fromManifest.length, "server actions in the build's manifest").toBeGreaterThan(10);
    for (const key of [...fromManifest, ...fromSource]) {
      if (!expectations[key]) expect.fail(`no expectation for ${key}`);
    }
    expect(fromSource, "server actions in the source vs the production build (.next-test is stale or an action is not exported)").toEqual(fromManifest);
    for (const key of Object.keys(expectations)) expect(fromManifest, `stale expectation for ${key}`).toContain(key);
  });

  it("the encoding works: crew A's lead renames crew A, and the crew page shows the new name", async () => {
    const key = "app/(app)/crew/actions.ts#renameCrewAction";
    const name = `Action alpha crew ${hex} renamed`;
    const r = await callAction(clients.lead, byKey.get(key)!.id, [{ status: "idle" }, formOf({ crewId: A.crewId, name })], { page: "/crew" });
    expect(r.status, r.body.slice(0, 300)).toBe(200);
    expect(r.value).toMatchObject({ status: "ok", message: "Crew renamed." });
    const [row] = await db().select({ name: crews.name }).from(crews).where(eq(crews.id, A.crewId));
    expect(row.name).toBe(name);
    const page = await (await clients.lead.get("/crew")).text();
    expect(page).toContain(name);
  });

  for (const key of fromManifest.filter((k) => expectations[k])) {
    it(key, async () => {
      const e = expectations[key];
      const cells: string[] = [];
      for (const side of ["own", "other"] as const) {
        for (const who of WHO) {
          const c = cellFor(who, side);
          await e.prepare?.(c);
          const before = await e.state?.(c);
          const bBefore = await snapshotB();
          const { r, fields } = await call(key, c, clients[who]);
          const want = expected(e, c);
          const got = r.redirect ? "redirect" : r.thrown ? "thrown" : ((r.value as { status?: string } | undefined)?.status ?? "void");
          const where = `${key} as ${who} (${side} crew) → ${r.status} ${got}: ${JSON.stringify(r.value)} ${r.body.slice(0, 200)}`;
          const value = r.value as { status?: string; message?: string } | undefined;
          const allowed = "ok" in want;
          if ("ok" in want) {
            expect(r.thrown, where).toBe(false);
            if (want.redirect) expect(r.redirect, where).toBe(want.redirect);
            else {
              expect(r.status, where).toBe(200);
              if (!e.plainForm) expect(value?.status, where).toBe("ok");
            }
            if (want.message) expect(value?.message, where).toMatch(want.message);
            if (e.state && e.applied) e.applied(c, await e.state(c), r);
          } else {
            if ("thrown" in want) expect(r.thrown, where).toBe(true);
            else {
              expect(r.thrown, where).toBe(false);
              expect(r.redirect, where).toBeNull();
              expect(value?.status, where).toBe("error");
              if (typeof want.refused === "string") expect(value?.message, where).toBe(want.refused);
              else expect(value?.message, where).toMatch(want.refused);
            }
            // A refused call changed nothing.
            if (e.state) expect(await e.state(c), `${where}: state changed`).toEqual(before);
          }
          e.check?.(c, r, allowed);
          // V4.2.1: crew B is as it was, and nothing of it is in the answer (body or headers).
          expect(await snapshotB(), `${where}: crew B changed`).toEqual(bBefore);
          assertNoLeak(r.body + "\n" + [...r.headers].map(([k, v]) => `${k}: ${v}`).join("\n"), where, fields);
          if (allowed) await e.cleanup?.(c);
          cells.push(got);
        }
      }
      summary.set(key, cells);
    });
  }

  // ---- Sessions, tokens, origins -------------------------------------------------------------

  const renameKey = "app/(app)/crew/actions.ts#renameCrewAction";
  const crewName = async () => (await db().select({ name: crews.name }).from(crews).where(eq(crews.id, A.crewId)))[0].name;

  it("V3.5.2: an API token cannot drive a form, even one of its owner's own", async () => {
    const bearer = new Client(pilotToken);
    const before = await crewName();
    for (const key of ["app/(app)/runs/[runId]/actions.ts#addNoteAction", "app/(app)/settings/actions.ts#createApiTokenAction", "app/(app)/settings/actions.ts#updateProfileAction"]) {
      const c = { ...cellFor("pilot", "own"), me: members.pilot };
      const before = await expectations[key].state?.(c);
      const { r } = await call(key, c, bearer);
      expect(r.value, key).toMatchObject({ status: "error", message: "Sign in in the browser to do this" });
      expect(await expectations[key].state?.(c), key).toEqual(before);
    }
    const { r } = await call(renameKey, cellFor("lead", "own"), new Client(pilotToken));
    expect((r.value as { status: string }).status).toBe("error");
    expect(await crewName()).toBe(before);
  });

  it("V3.5.3: a tampered or foreign-secret session cookie counts as signed out", async () => {
    const before = await crewName();
    const forged = [
      "next-auth.session-token=garbage",
      // A well-formed but unsigned JWE-looking value.
      `next-auth.session-token=${["eyJhbGciOiJkaXIiLCJlbmMiOiJBMjU2R0NNIn0", "", randomBytes(12).toString("base64url"), randomBytes(64).toString("base64url"), randomBytes(16).toString("base64url")].join(".")}`,
    ];
    for (const cookie of forged) {
      const { r } = await call(renameKey, cellFor("lead", "own"), new Client(), { headers: { cookie } });
      expect(r.value, cookie).toMatchObject({ status: "error", message: SIGN_IN });
    }
    expect(await crewName()).toBe(before);
  });

  it("V4.2.2: an action posted from another origin is refused and changes nothing", async () => {
    const before = await crewName();
    for (const origin of ["https://evil.example", "null"]) {
      const { r } = await call(renameKey, cellFor("lead", "own"), clients.lead, { origin });
      expect(r.value, origin).not.toMatchObject({ status: "ok" });
      expect(r.status, origin).toBeGreaterThanOrEqual(400);
    }
    expect(await crewName()).toBe(before);
  });

  /** A fresh crew A pilot, signed in, with the session cookie as the browser holds it. */
  async function freshPilot(label: string) {
    const email = uniqueEmail(label);
    const res = await clients.lead.post(`/api/crews/${A.crewId}/invitations`, { email, role: "pilot" });
    expect(res.status, await res.text()).toBe(201);
    const token = tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/"));
    const { userId } = await acceptInvitation(token, { name: `Matrix ${label}`, password: testPassword });
    const client = new Client();
    expect(await client.signIn(email, testPassword)).toBeNull();
    // The jar is private to Client; a test may read it to replay the cookie like a thief would.
    const jar = (client as unknown as { cookies: Map<string, string> }).cookies;
    return { userId, client, cookie: [...jar].map(([k, v]) => `${k}=${v}`).join("; ") };
  }
  const noteKey = "app/(app)/runs/[runId]/actions.ts#addNoteAction";
  const addNote = (client: Client, body: string, headers?: Record<string, string>) =>
    callAction(client, byKey.get(noteKey)!.id, [{ status: "idle" }, formOf({ runId: A.runId, body })], { page: `/runs/${A.runId}`, headers });
  const notesWith = async (body: string) => (await db().select({ id: runNotes.id }).from(runNotes).where(eq(runNotes.body, body))).length;

  it("V4.1.1: a member removed from the crew loses access at once, with the same session", async () => {
    const p = await freshPilot("action-removed");
    expect((await addNote(p.client, `before removal ${hex}`)).value).toMatchObject({ status: "ok" });
    const removed = await callAction(clients.lead, byKey.get("app/(app)/crew/actions.ts#removeMemberAction")!.id, [{ status: "idle" }, formOf({ crewId: A.crewId, userId: p.userId })], { page: "/crew" });
    expect(removed.value).toMatchObject({ status: "ok" });
    expect((await addNote(p.client, `after removal ${hex}`)).value).toMatchObject({ status: "error", message: "Run not found" });
    expect(await notesWith(`after removal ${hex}`)).toBe(0);
  });

  // Sessions are signed cookies; sign-out records the session's id as ended (lib/auth/sessions.ts),
  // so a copy of the cookie is refused on every instance.
  it("V3.3.1: after sign-out a copied session cookie no longer drives an action", async () => {
    const p = await freshPilot("action-replay");
    const csrf = (await (await p.client.get("/api/auth/csrf")).json()) as { csrfToken: string };
    const out = await p.client.request("/api/auth/signout", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken: csrf.csrfToken, json: "true" }).toString(),
    });
    expect(out.status).toBe(200);
    const r = await addNote(new Client(), `replayed ${hex}`, { cookie: p.cookie });
    expect(r.value).toMatchObject({ status: "error", message: SIGN_IN });
    expect(await notesWith(`replayed ${hex}`)).toBe(0);
  });

  it("V4.2.1 within a crew: a lead cannot revoke a member's API token, nor act on crew B's member through crew A", async () => {
    const key = "app/(app)/settings/actions.ts#revokeApiTokenAction";
    const pilotUser = (await getUserById(members.pilot.userId))!;
    const { id } = await createApiToken({ user: pilotUser, via: "session" }, "pilot's own");
    const c = { ...cellFor("lead", "own"), data: { tokenId: id } };
    const { r } = await call(key, c, clients.lead);
    expect(r.value).toMatchObject({ status: "error", message: "API token not found" });
    expect((await db().select({ revokedAt: apiTokens.revokedAt }).from(apiTokens).where(eq(apiTokens.id, id)))[0].revokedAt).toBeNull();

    // Crew A's id with crew B's member: the member is looked up in crew A only.
    const bBefore = await snapshotB();
    for (const k of ["app/(app)/crew/actions.ts#changeRoleAction", "app/(app)/crew/actions.ts#removeMemberAction"]) {
      const res = await callAction(clients.lead, byKey.get(k)!.id, [{ status: "idle" }, formOf({ crewId: A.crewId, userId: bMember.userId, role: "observer" })], { page: "/crew" });
      expect(res.value, k).toMatchObject({ status: "error", message: "Member not found" });
      assertNoLeak(res.body, k);
    }
    expect(await snapshotB()).toEqual(bBefore);
  });
});
