/**
 * Failsafe bench tests recorded on a build, and link-sheet changes re-analysing the build's runs
 * (issue 12, items 3 and 5; DESIGN.md §10 "Bench failsafe test": "recorded on the build with its
 * date and result; a link-sheet change after it makes it stale"), through the running test build.
 *
 * Most tests write the analysis contract's bench summary onto a ready run (markAsBenchRun in
 * tests/helpers/bench-log.ts), so the recording rules are tested apart from the analysis. The
 * last describe block uploads a bench log and needs the analysis itself to mark it as a bench
 * run (`summary.bench`, the commanded/flown failsafe): it waits for issue 12's analysis.
 */
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { auditLog, builds, runs } from "@/db/schema";
import { acceptInvitation, inviteMember } from "@/lib/crews/invitations";
import { dayWords, dayWordsBeside } from "@/lib/builds/bench-test-facts";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { BENCH, benchCsv, benchSheet, markAsBenchRun } from "../helpers/bench-log";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

interface BenchTestJson {
  id: number;
  buildId: number;
  runId: number | null;
  testedAt: string;
  recordedAt: string;
  result: string;
  commandedLatencyS: number | null;
  flownLatencyS: number | null;
  flownState: string | null;
  action: string | null;
  note: string | null;
  runTitle: string | null;
  recordedByName: string | null;
  stale: boolean;
}

async function json<T = Record<string, unknown>>(res: Response, status: number): Promise<T> {
  const text = await res.text();
  expect(res.status, text).toBe(status);
  return JSON.parse(text) as T;
}

async function join(lead: Awaited<ReturnType<typeof newLead>>, role: "pilot" | "observer") {
  const email = uniqueEmail(`bench-${role}`);
  await inviteMember(lead.actor, lead.crewId, { email, role });
  await acceptInvitation(tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/")), { name: `Bench ${role}`, password: testPassword });
  const c = new Client();
  expect(await c.signIn(email, testPassword)).toBeNull();
  return c;
}

/** A page's HTML with React's text-node separators taken out, so sentences read whole. */
const pageText = async (res: Response) => (await res.text()).replace(/<!-- -->/g, "");

const roverCsv = (seed: number) => toCsv(simulateRun({ seed, waypoints: demoCrew.routePlans[0].waypoints }));

describe("failsafe bench tests on a build", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  const c = new Client();

  async function newBuild(name: string, vehicleType = "multirotor"): Promise<number> {
    const id = (await json<{ id: number }>(await c.post("/api/builds", { crewId: lead.crewId, name, vehicleType }), 201)).id;
    await json(await c.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: benchSheet() }), 200);
    return id;
  }

  /** A ready run of the build carrying the contract's bench summary (the analysis is not asked). */
  async function benchRun(buildId: number, name: string, failsafe: Record<string, unknown> = {}) {
    const start = new Date();
    const up = await uploadLog(c, `${name}.csv`, benchCsv(start), { crewId: lead.crewId, buildId });
    expect((await settledRun(c, up.runId)).status).toBe("ready");
    await markAsBenchRun(up.runId, failsafe);
    return { runId: up.runId, start };
  }

  const record = (client: Client, buildId: number, body: unknown) => client.post(`/api/builds/${buildId}/bench-tests`, body);
  const list = async (client: Client, buildId: number) => (await json<{ benchTests: BenchTestJson[]; linkSheetChangedAt: string | null }>(await client.get(`/api/builds/${buildId}/bench-tests`), 200));

  beforeAll(async () => {
    lead = await newLead("bench");
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
  });

  it("records a bench run on its build with its date and result, once; the build page and the checklist show it", { timeout: 60_000 }, async () => {
    const buildId = await newBuild("Bench quad");
    // No test yet: the build page says what to do, the checklist lists it as missing.
    expect((await list(c, buildId)).benchTests).toEqual([]);
    const emptyPage = await pageText(await c.get(`/builds/${buildId}`));
    expect(emptyPage).toContain("No failsafe bench test recorded for this build");
    expect(emptyPage).toContain("with the propellers off");
    expect(await pageText(await c.get(`/builds/${buildId}/checklist`))).toContain("No failsafe bench test recorded for this build: bench-test it before the run.");

    const { runId, start } = await benchRun(buildId, "bench-quad-1");
    const made = await json<{ benchTest: BenchTestJson; created: boolean }>(await record(c, buildId, { runId, note: "On the stand, <props off>" }), 201);
    expect(made.created).toBe(true);
    expect(made.benchTest).toMatchObject({
      buildId,
      runId,
      result: "pass",
      flownState: "not-logged",
      flownLatencyS: null,
      action: null,
      note: "On the stand, <props off>",
      runTitle: "bench-quad-1",
      recordedByName: "bench lead",
      stale: false,
    });
    expect(made.benchTest.commandedLatencyS).toBeCloseTo(BENCH.commandDelayS, 5);
    // The test's date is the log's own start (ISO times in the file), not the upload.
    expect(new Date(made.benchTest.testedAt).getTime()).toBe(start.getTime());

    // The same run again: the existing record, not a second one.
    const again = await json<{ benchTest: BenchTestJson; created: boolean }>(await record(c, buildId, { runId }), 200);
    expect(again).toMatchObject({ created: false, benchTest: { id: made.benchTest.id } });
    expect((await list(c, buildId)).benchTests.map((t) => t.id)).toEqual([made.benchTest.id]);

    const [entry] = await db().select().from(auditLog).where(and(eq(auditLog.action, "build.bench-test-recorded"), eq(auditLog.targetId, String(buildId))));
    expect(entry.detail).toMatchObject({ runId, result: "pass", benchTestId: made.benchTest.id });

    const page = await pageText(await c.get(`/builds/${buildId}`));
    expect(page).toContain("Failsafe bench test");
    expect(page).toContain("Acted as planned");
    expect(page).toContain("0.4 s after the loss (channel 8 at its failsafe value)");
    expect(page).toContain("not logged (no mode column, no track)");
    // The note is the lead's text: escaped, never markup.
    expect(page).toContain("On the stand, &lt;props off&gt;");
    expect(page).not.toContain("Stale:");
    const checklist = await pageText(await c.get(`/builds/${buildId}/checklist`));
    expect(checklist).toContain(`Failsafe bench test of ${dayWords(start)}: acted as planned, and the link sheet has not changed since.`);
    // The debrief says it was recorded.
    expect(await pageText(await c.get(`/runs/${runId}`))).toContain("Recorded as the failsafe bench test of");
  });

  it("refuses pilots and observers (403) and other crews (404), and records nothing", { timeout: 90_000 }, async () => {
    const buildId = await newBuild("Roles quad");
    const { runId } = await benchRun(buildId, "bench-roles");
    const pilot = await join(lead, "pilot");
    const observer = await join(lead, "observer");
    for (const who of [pilot, observer]) {
      expect((await json<{ error: { code: string } }>(await record(who, buildId, { runId }), 403)).error.code).toBe("forbidden");
      // Reading is for every member.
      expect((await list(who, buildId)).benchTests).toEqual([]);
    }
    const other = await newLead("bench-outsider");
    const o = new Client();
    expect(await o.signIn(other.email, testPassword)).toBeNull();
    await json(await record(o, buildId, { runId }), 404);
    await json(await o.get(`/api/builds/${buildId}/bench-tests`), 404);
    // The outsider's own build with our run: the run is not found, and its title does not leak.
    const theirs = (await json<{ id: number }>(await o.post("/api/builds", { crewId: other.crewId, name: "Theirs", vehicleType: "ground" }), 201)).id;
    const refused = await json<{ error: { message: string } }>(await record(o, theirs, { runId }), 404);
    expect(refused.error.message).toBe("Run not found");
    expect(JSON.stringify(refused)).not.toContain("bench-roles");
    expect((await list(c, buildId)).benchTests).toEqual([]);
    expect((await list(o, theirs)).benchTests).toEqual([]);
  });

  it("refuses a run that is not a bench log, one on another build, one not analysed and one whose failsafe was not exercised", { timeout: 90_000 }, async () => {
    const buildId = await newBuild("Picky quad");
    const otherBuild = await newBuild("Other quad");

    // A field run with GPS fixes: analysed as a run, not a bench test.
    const field = await uploadLog(c, "field-run.csv", roverCsv(21), { crewId: lead.crewId, buildId });
    expect((await settledRun(c, field.runId)).status).toBe("ready");
    const notBench = await json<{ error: { code: string; message: string; details: { fields: Record<string, string[]> } } }>(await record(c, buildId, { runId: field.runId }), 422);
    expect(notBench.error.message).toMatch(/^This run is not a bench test/);
    expect(notBench.error.details.fields.runId).toHaveLength(1);

    // A bench run of another build: attach it first.
    const elsewhere = await benchRun(otherBuild, "bench-elsewhere");
    expect((await json<{ error: { code: string; message: string } }>(await record(c, buildId, { runId: elsewhere.runId }), 409)).error.message).toBe(
      "This run is not attached to Picky quad; attach it to the build first",
    );

    // The failsafe was not exercised: nothing to record, and the analysis' reason is given.
    const quiet = await benchRun(buildId, "bench-no-loss", { result: "not-assessed", why: "no link loss in this run to exercise it", commanded: null, flown: null });
    expect((await json<{ error: { message: string } }>(await record(c, buildId, { runId: quiet.runId }), 422)).error.message).toContain("(no link loss in this run to exercise it)");

    // Not analysed yet (being read again).
    const busy = await benchRun(buildId, "bench-busy");
    await db().update(runs).set({ status: "parsing" }).where(eq(runs.id, busy.runId));
    await json(await record(c, buildId, { runId: busy.runId }), 409);
    await db().update(runs).set({ status: "ready" }).where(eq(runs.id, busy.runId));

    // Bodies are checked; a retired build takes no new test.
    await json(await record(c, buildId, {}), 422);
    await json(await record(c, buildId, { runId: busy.runId, note: "x".repeat(501) }), 422);
    await json(await record(c, buildId, { runId: busy.runId, extra: 1 }), 422);
    await json(await c.post(`/api/builds/${buildId}/retire`, { retired: true }), 200);
    await json(await record(c, buildId, { runId: busy.runId }), 409);
    await json(await c.post(`/api/builds/${buildId}/retire`, { retired: false }), 200);
    await json(await record(c, buildId, { runId: busy.runId }), 201);
    expect((await list(c, buildId)).benchTests.map((t) => t.runId)).toEqual([busy.runId]);
  });

  it("marks the test stale once the link sheet or the failsafe plan changes after it; a newer test is current again", { timeout: 90_000 }, async () => {
    const buildId = await newBuild("Stale quad");
    const first = await benchRun(buildId, "bench-stale-1");
    await json(await record(c, buildId, { runId: first.runId }), 201);

    // Saving the same sheet changes nothing and keeps the test current.
    expect((await json<{ changed: string[] }>(await c.request(`/api/builds/${buildId}/link-sheet`, { method: "PUT", json: benchSheet() }), 200)).changed).toEqual([]);
    expect((await list(c, buildId)).benchTests[0].stale).toBe(false);

    const sheet = benchSheet();
    sheet.channels[7] = { ...sheet.channels[7], failsafeUs: 1950 };
    await json(await c.request(`/api/builds/${buildId}/link-sheet`, { method: "PUT", json: sheet }), 200);
    const after = await list(c, buildId);
    expect(after.benchTests[0].stale).toBe(true);
    const changedAt = new Date(after.linkSheetChangedAt!);
    expect(changedAt.getTime()).toBeGreaterThan(first.start.getTime());
    const page = await pageText(await c.get(`/builds/${buildId}`));
    // Tested and changed on the same day: the times say which came first.
    expect(page).toContain(`the link sheet changed on ${dayWordsBeside(changedAt, first.start)} after this test — test again`);
    expect(await pageText(await c.get(`/builds/${buildId}/checklist`))).toContain(
      `The failsafe bench test of ${dayWordsBeside(first.start, changedAt)} is stale: the link sheet changed on ${dayWordsBeside(changedAt, first.start)}.`,
    );

    // A newer bench test holds again; then the plan alone (edited with the build's fields) makes it stale.
    expect((await settledRun(c, first.runId)).status).toBe("ready");
    const second = await benchRun(buildId, "bench-stale-2");
    await json(await record(c, buildId, { runId: second.runId }), 201);
    const now = await list(c, buildId);
    expect(now.benchTests.map((t) => [t.runId, t.stale])).toEqual([
      [second.runId, false],
      [first.runId, true],
    ]);
    expect(await pageText(await c.get(`/builds/${buildId}`))).toContain("Earlier bench tests (1)");
    await json(await c.request(`/api/builds/${buildId}`, { method: "PUT", json: { failsafeWithinS: 1 } }), 200);
    expect((await list(c, buildId)).benchTests[0].stale).toBe(true);
    // A change the bench test does not depend on leaves it as it was.
    const [{ at }] = await db().select({ at: builds.linkSheetChangedAt }).from(builds).where(eq(builds.id, buildId));
    await json(await c.request(`/api/builds/${buildId}`, { method: "PUT", json: { notes: "new antenna mount" } }), 200);
    const [{ at: atAfter }] = await db().select({ at: builds.linkSheetChangedAt }).from(builds).where(eq(builds.id, buildId));
    expect(atAfter).toEqual(at);
  });
});

describe("a link-sheet change re-analyses the build's runs", () => {
  it("queues the build's ready runs (not other builds'), which come back ready with the new sheet", { timeout: 120_000 }, async () => {
    const lead = await newLead("reanalyse");
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const mk = async (name: string) => (await json<{ id: number }>(await c.post("/api/builds", { crewId: lead.crewId, name, vehicleType: "ground", failsafeAction: "return-to-home", failsafeWithinS: 1.5 }), 201)).id;
    const a = await mk("Rover A");
    const b = await mk("Rover B");
    const ups = [
      await uploadLog(c, "a-1.csv", roverCsv(31), { crewId: lead.crewId, buildId: a }),
      await uploadLog(c, "a-2.csv", roverCsv(32), { crewId: lead.crewId, buildId: a }),
      await uploadLog(c, "b-1.csv", roverCsv(33), { crewId: lead.crewId, buildId: b }),
    ];
    for (const u of ups) expect((await settledRun(c, u.runId)).status).toBe("ready");
    const planOf = async (runId: number) =>
      (await json<{ run: { summary: { failsafe: { plan: { action: string } | null } } } }>(await c.get(`/api/runs/${runId}`), 200)).run.summary.failsafe.plan?.action;
    const stamp = async (runId: number) => (await db().select({ u: runs.updatedAt }).from(runs).where(eq(runs.id, runId)))[0].u.getTime();
    const bBefore = await stamp(ups[2].runId);

    // The plan saved with the sheet turns to "hold": both of A's runs are read again with it.
    const sheet = { ...benchSheet(), failsafeAction: "hold" };
    const saved = await json<{ changed: string[]; reanalysing: number }>(await c.request(`/api/builds/${a}/link-sheet`, { method: "PUT", json: sheet }), 200);
    expect(saved.reanalysing).toBe(2);
    for (const u of ups.slice(0, 2)) {
      expect((await settledRun(c, u.runId)).status).toBe("ready");
      expect(await planOf(u.runId)).toBe("hold");
    }
    expect(await planOf(ups[2].runId)).toBe("return-to-home");
    expect(await stamp(ups[2].runId)).toBe(bBefore);
    const [entry] = await db().select().from(auditLog).where(and(eq(auditLog.action, "build.runs-reanalysed"), eq(auditLog.targetId, String(a))));
    expect(entry.detail).toEqual({ runs: 2, because: ["link-sheet"] });

    // No change, nothing queued; a field the analysis reads queues them; one it does not read, not.
    expect((await json<{ reanalysing: number }>(await c.request(`/api/builds/${a}/link-sheet`, { method: "PUT", json: sheet }), 200)).reanalysing).toBe(0);
    expect((await json<{ reanalysing: number }>(await c.request(`/api/builds/${a}`, { method: "PUT", json: { notes: "spare wheels" } }), 200)).reanalysing).toBe(0);
    expect((await json<{ reanalysing: number }>(await c.request(`/api/builds/${a}`, { method: "PUT", json: { rxSensitivityDbm: -105 } }), 200)).reanalysing).toBe(2);
    for (const u of ups.slice(0, 2)) expect((await settledRun(c, u.runId)).status).toBe("ready");

    // A run being read right now is not queued twice.
    await db().update(runs).set({ status: "analysing" }).where(eq(runs.id, ups[0].runId));
    expect((await json<{ reanalysing: number }>(await c.request(`/api/builds/${a}`, { method: "PUT", json: { batteryCells: 4 } }), 200)).reanalysing).toBe(1);
    await db().update(runs).set({ status: "ready" }).where(eq(runs.id, ups[0].runId));
    for (const u of ups.slice(0, 2)) expect((await settledRun(c, u.runId)).status).toBe("ready");
  });
});

// ---- Waits for issue 12's analysis (summary.bench, commanded/flown failsafe) ------------------

describe("a bench log analysed by issue 12's analysis (waits for it)", () => {
  it("is read as a bench run, shows the record button to the lead, and records from the real summary", { timeout: 60_000 }, async () => {
    const lead = await newLead("bench-real");
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const buildId = (await json<{ id: number }>(await c.post("/api/builds", { crewId: lead.crewId, name: "Real bench quad", vehicleType: "multirotor" }), 201)).id;
    await json(await c.request(`/api/builds/${buildId}/link-sheet`, { method: "PUT", json: benchSheet() }), 200);
    const start = new Date();
    const up = await uploadLog(c, "real-bench.csv", benchCsv(start), { crewId: lead.crewId, buildId });
    expect((await settledRun(c, up.runId)).status).toBe("ready");
    const { summary } = (await json<{ run: { summary: Record<string, unknown> } }>(await c.get(`/api/runs/${up.runId}`), 200)).run;
    expect(summary.bench).toBe(true);
    const failsafe = summary.failsafe as { result: string; commanded: { latencyS: number } | null; flown: { state: string } | null };
    expect(failsafe.result).toBe("pass");
    // The log's own timeline: channel 8 reaches 1900 µs 0.4 s after the loss; one sample (0.1 s) of tolerance.
    expect(failsafe.commanded?.latencyS).toBeCloseTo(BENCH.commandDelayS, 0);
    expect(Math.abs(failsafe.commanded!.latencyS - BENCH.commandDelayS)).toBeLessThanOrEqual(1 / BENCH.hz + 1e-9);
    expect(failsafe.flown?.state).toBe("not-logged");

    expect(await pageText(await c.get(`/runs/${up.runId}`))).toContain("Record as the failsafe bench test of");
    const made = await json<{ benchTest: BenchTestJson }>(await c.post(`/api/builds/${buildId}/bench-tests`, { runId: up.runId }), 201);
    expect(made.benchTest).toMatchObject({ result: "pass", flownState: "not-logged", stale: false });
    expect(new Date(made.benchTest.testedAt).getTime()).toBe(start.getTime());
  });
});
