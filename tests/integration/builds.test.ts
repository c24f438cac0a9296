/**
 * Builds through the API of the running test build: edits and their history, the link sheet and
 * its check, retiring, photos (type and size refused, a real one stored and shown), moving a run
 * to another build (re-analysed with that build's plan), and who may do what. Logs come from our
 * own simulator (scripts/simulator); the PNG is written by tests/helpers/tiny-png.ts.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { demoCrew } from "@/db/demo-crew";
import { acceptInvitation, inviteMember } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { tinyPng } from "../helpers/tiny-png";
import { settledRun, uploadLog } from "../helpers/uploads";

type Channel = {
  channel: number;
  function: string;
  switchLabel?: string | null;
  positions?: number | null;
  engageMinUs?: number | null;
  engageMaxUs?: number | null;
  failsafeUs?: number | null;
};

/** A consistent sheet for the simulator's rover: arm on 5, mission on 6, return to home on 7. */
function roverSheet(over: Record<number, Partial<Channel>> = {}): Channel[] {
  const base: Record<number, Channel> = {
    1: { channel: 1, function: "roll" },
    2: { channel: 2, function: "throttle" },
    3: { channel: 3, function: "pitch" },
    4: { channel: 4, function: "yaw" },
    5: { channel: 5, function: "arm", switchLabel: "A", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 },
    6: { channel: 6, function: "mission", switchLabel: "C", positions: 3, engageMinUs: 1400, engageMaxUs: 1600, failsafeUs: 1000 },
    7: { channel: 7, function: "return-to-home", switchLabel: "C", positions: 3, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 },
  };
  return Array.from({ length: 18 }, (_, i) => ({ ...(base[i + 1] ?? { channel: i + 1, function: "unused" }), ...over[i + 1] }));
}

async function json<T = Record<string, unknown>>(res: Response, status: number): Promise<T> {
  const text = await res.text();
  expect(res.status, text).toBe(status);
  return JSON.parse(text) as T;
}

interface Finding {
  rule: string;
  severity: string;
  why: string;
  fix: string;
  runIds: number[];
  channels: number[];
}
const rules = (check: { findings: Finding[] }) => check.findings.map((f) => f.rule);

async function join(lead: Awaited<ReturnType<typeof newLead>>, role: "pilot" | "observer") {
  const email = uniqueEmail(`builds-${role}`);
  await inviteMember(lead.actor, lead.crewId, { email, role });
  await acceptInvitation(tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/")), { name: `Builds ${role}`, password: testPassword });
  const c = new Client();
  expect(await c.signIn(email, testPassword)).toBeNull();
  return c;
}

describe("builds API", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  const c = new Client();

  async function newBuild(name: string, extra: Record<string, unknown> = {}): Promise<number> {
    const res = await c.post("/api/builds", {
      crewId: lead.crewId,
      name,
      vehicleType: "ground",
      bandMhz: 868,
      rxSensitivityDbm: -112,
      failsafeAction: "return-to-home",
      failsafeWithinS: 1.5,
      ...extra,
    });
    return (await json<{ id: number }>(res, 201)).id;
  }

  beforeAll(async () => {
    lead = await newLead("builds");
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
  });

  it("edits every field, records each change with from/to and who made it", async () => {
    const id = await newBuild("Edit me");
    const edit = {
      name: "Edited",
      vehicleType: "boat",
      frame: "Catamaran hull",
      flightController: "Open controller",
      firmware: "Open firmware",
      firmwareVersion: "1.2.3",
      receiver: "868 receiver",
      transmitter: "Hand radio",
      bandMhz: 915,
      txPowerMw: 2.4,
      rxSensitivityDbm: -108.5,
      antennas: "Whip",
      batteryCells: 3,
      batteryCapacityMah: 2200,
      notes: "Spare props in the red box",
      failsafeAction: "hold",
      failsafeWithinS: 2,
    };
    const put = await json<{ changed: string[]; build: Record<string, unknown> }>(await c.request(`/api/builds/${id}`, { method: "PUT", json: edit }), 200);
    expect(put.changed.sort()).toEqual(Object.keys(edit).sort());
    expect(put.build.name).toBe("Edited");
    // The same values again (2.4 comes back from a FLOAT column as 2.4000000953…): no change.
    expect((await json<{ changed: string[] }>(await c.request(`/api/builds/${id}`, { method: "PUT", json: edit }), 200)).changed).toEqual([]);
    const cleared = await json<{ changed: string[] }>(await c.request(`/api/builds/${id}`, { method: "PUT", json: { receiver: null, notes: "" } }), 200);
    expect(cleared.changed.sort()).toEqual(["notes", "receiver"]);

    const { changes } = await json<{ changes: { changes: Record<string, { from: unknown; to: unknown }>; byName: string }[] }>(await c.get(`/api/builds/${id}/history`), 200);
    expect(changes).toHaveLength(2);
    expect(changes[0].changes).toEqual({ receiver: { from: "868 receiver", to: null }, notes: { from: "Spare props in the red box", to: null } });
    expect(changes[1].changes.name).toEqual({ from: "Edit me", to: "Edited" });
    expect(changes[1].changes.bandMhz).toEqual({ from: 868, to: 915 });
    expect(changes[1].changes.failsafeAction).toEqual({ from: "return-to-home", to: "hold" });
    expect(changes[1].byName).toBe("builds lead");

    const bad = await json<{ error: { code: string; details: { fields: Record<string, string[]> } } }>(
      await c.request(`/api/builds/${id}`, { method: "PUT", json: { rxSensitivityDbm: 5, batteryCells: 1.5 } }),
      422,
    );
    expect(bad.error.code).toBe("invalid_input");
    expect(Object.keys(bad.error.details.fields).sort()).toEqual(["batteryCells", "rxSensitivityDbm"]);
    await json(await c.request(`/api/builds/${id}`, { method: "PUT", json: { colour: "red" } }), 422);
    await json(await c.request(`/api/builds/${id}`, { method: "PUT", body: "not json" }), 422);
  });

  it("saves the link sheet with the plan, records channel changes and answers with the check", async () => {
    const id = await newBuild("Sheet");
    const before = (await json<{ check: { findings: Finding[] } }>(await c.get(`/api/builds/${id}/check`), 200)).check;
    expect(rules(before)).toEqual(expect.arrayContaining(["failsafe-no-channel", "arm-missing", "rth-missing", "mission-missing"]));
    for (const f of before.findings) expect(f.why.length).toBeGreaterThan(20);

    const saved = await json<{ changed: string[]; check: { findings: Finding[]; counts: Record<string, number> } }>(
      await c.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet(), failsafeAction: "return-to-home", failsafeWithinS: 1.2 } }),
      200,
    );
    expect(saved.check.findings).toEqual([]);
    expect(saved.changed).toContain("ch7.function");
    expect(saved.changed).toContain("failsafeWithinS");
    const { changes } = await json<{ changes: { changes: Record<string, { from: unknown; to: unknown }> }[] }>(await c.get(`/api/builds/${id}/history`), 200);
    expect(changes[0].changes["ch7.function"]).toEqual({ from: "unused", to: "return-to-home" });
    expect(changes[0].changes["ch7.failsafeUs"]).toEqual({ from: null, to: 2000 });
    expect(changes[0].changes.failsafeWithinS).toEqual({ from: 1.5, to: 1.2 });

    // Return to home on a second channel: the check says so, naming both.
    const dup = await json<{ check: { findings: Finding[] } }>(
      await c.request(`/api/builds/${id}/link-sheet`, {
        method: "PUT",
        json: { channels: roverSheet({ 9: { function: "return-to-home", engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 } }) },
      }),
      200,
    );
    const f = dup.check.findings.find((x) => x.rule === "rth-duplicate")!;
    expect(f.severity).toBe("error");
    expect(f.channels).toEqual([7, 9]);
    expect(rules((await json<{ check: { findings: Finding[] } }>(await c.get(`/api/builds/${id}/check`), 200)).check)).toContain("rth-duplicate");
    const build = (await json<{ build: { channels: Channel[]; failsafeWithinS: number } }>(await c.get(`/api/builds/${id}`), 200)).build;
    expect(build.channels[8].function).toBe("return-to-home");
    // The plan was not sent the second time, so it stayed.
    expect(build.failsafeWithinS).toBeCloseTo(1.2, 5);

    await json(await c.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet().slice(0, 17) } }), 422);
    await json(await c.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet({ 5: { engageMinUs: 90 } }) } }), 422);
    await json(await c.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet({ 5: { function: "lights" } }) } }), 422);
  });

  it("retires a build and brings it back, in the history and the list", async () => {
    const id = await newBuild("Old rover");
    const r = await json<{ retiredAt: string | null }>(await c.post(`/api/builds/${id}/retire`, { retired: true }), 200);
    expect(r.retiredAt).not.toBeNull();
    const list = await json<{ builds: { id: number }[] }>(await c.get(`/api/builds?crewId=${lead.crewId}`), 200);
    expect(list.builds.map((b) => b.id)).not.toContain(id);
    // No new log can be filed under a retired build through the API either.
    const refused = await c.post("/api/uploads", { fileName: "late.csv", size: 10, contentType: "text/csv", buildId: id });
    expect(refused.status).toBe(422);
    expect((await refused.json()).error.details.fields.buildId).toEqual(["Choose a build in service"]);
    expect((await json<{ retiredAt: string | null }>(await c.post(`/api/builds/${id}/retire`, { retired: false }), 200)).retiredAt).toBeNull();
    const { changes } = await json<{ changes: { changes: Record<string, unknown> }[] }>(await c.get(`/api/builds/${id}/history`), 200);
    expect(changes.map((x) => x.changes)).toEqual([{ retired: { from: true, to: false } }, { retired: { from: false, to: true } }]);
    await json(await c.post(`/api/builds/${id}/retire`, { retired: "yes" }), 422);
  });

  it("refuses photos of the wrong type or size, stores a real one and shows it by a short-lived link", async () => {
    const id = await newBuild("Photo");
    const gif = await json<{ error: { details: { fields: Record<string, string[]> } } }>(
      await c.post(`/api/builds/${id}/photos`, { fileName: "a.gif", contentType: "image/gif", size: 100 }),
      422,
    );
    expect(gif.error.details.fields.contentType).toBeDefined();
    const big = await json<{ error: { details: { fields: Record<string, string[]> } } }>(
      await c.post(`/api/builds/${id}/photos`, { fileName: "big.png", contentType: "image/png", size: 10 * 1024 * 1024 + 1 }),
      422,
    );
    expect(big.error.details.fields.size).toBeDefined();

    const png = tinyPng();
    const made = await json<{ photoId: number; putUrl: string; contentType: string }>(
      await c.post(`/api/builds/${id}/photos`, { fileName: "rover.png", contentType: "image/png", size: png.length, caption: "Left side" }),
      201,
    );
    expect((await fetch(made.putUrl, { method: "PUT", body: new Uint8Array(png), headers: { "content-type": made.contentType } })).status).toBe(200);
    await json(await c.post(`/api/builds/${id}/photos/${made.photoId}/complete`, {}), 200);
    const { photos } = await json<{ photos: { id: number; url: string; caption: string }[] }>(await c.get(`/api/builds/${id}/photos`), 200);
    expect(photos).toHaveLength(1);
    expect(photos[0].caption).toBe("Left side");
    expect(photos[0].url).toMatch(/X-Amz-Expires=300/);
    const img = await fetch(photos[0].url);
    expect(img.status).toBe(200);
    expect(Buffer.from(await img.arrayBuffer()).equals(png)).toBe(true);

    // Declared a PNG, sent text of the same length: the complete step looks at the bytes.
    const fake = Buffer.from("this is not an image at all".padEnd(png.length, "."));
    const f = await json<{ photoId: number; putUrl: string }>(await c.post(`/api/builds/${id}/photos`, { fileName: "fake.png", contentType: "image/png", size: fake.length }), 201);
    expect((await fetch(f.putUrl, { method: "PUT", body: new Uint8Array(fake), headers: { "content-type": "image/png" } })).status).toBe(200);
    await json(await c.post(`/api/builds/${id}/photos/${f.photoId}/complete`, {}), 422);
    // More bytes than announced: the store refuses the signed length, or the complete step does.
    const g = await json<{ photoId: number; putUrl: string }>(await c.post(`/api/builds/${id}/photos`, { fileName: "g.png", contentType: "image/png", size: png.length }), 201);
    const longer = await fetch(g.putUrl, { method: "PUT", body: new Uint8Array(Buffer.concat([png, png])), headers: { "content-type": "image/png" } });
    if (longer.ok) await json(await c.post(`/api/builds/${id}/photos/${g.photoId}/complete`, {}), 422);
    expect((await json<{ photos: unknown[] }>(await c.get(`/api/builds/${id}/photos`), 200)).photos).toHaveLength(1);

    await json(await c.request(`/api/builds/${id}/photos/${made.photoId}`, { method: "DELETE" }), 200);
    expect((await json<{ photos: unknown[] }>(await c.get(`/api/builds/${id}/photos`), 200)).photos).toHaveLength(0);
    const { changes } = await json<{ changes: { changes: Record<string, unknown> }[] }>(await c.get(`/api/builds/${id}/history`), 200);
    expect(changes.map((x) => x.changes)).toEqual([{ photo: { from: "rover.png", to: null } }, { photo: { from: null, to: "rover.png" } }]);
  });

  it("moves a run to another build and analyses it again with that build's plan; the logs feed the check", { timeout: 90_000 }, async () => {
    const a = await newBuild("Plan return");
    const b = await newBuild("Plan hold", { failsafeAction: "hold", failsafeWithinS: 1 });
    await json(await c.request(`/api/builds/${a}/link-sheet`, { method: "PUT", json: { channels: roverSheet() } }), 200);
    // Build B's receiver is said to write RSSI on channel 8 — but in this log channel 8 is the throttle.
    await json(await c.request(`/api/builds/${b}/link-sheet`, { method: "PUT", json: { channels: roverSheet({ 8: { function: "rssi" } }) } }), 200);
    const sim = simulateRun({ seed: 5, waypoints: demoCrew.routePlans[0].waypoints }).map((s) => ({ ...s, ch: [...s.ch.slice(0, 7), s.ch[1]] }));
    const up = await uploadLog(c, "move-me.csv", toCsv(sim), { crewId: lead.crewId, buildId: a });
    const first = await settledRun(c, up.runId);
    expect(first.status).toBe("ready");
    const s1 = (await json<{ run: { summary: { failsafe: { plan: { action: string }; action: string } } } }>(await c.get(`/api/runs/${up.runId}`), 200)).run.summary;
    expect(s1.failsafe.plan.action).toBe("return-to-home");
    expect(s1.failsafe.action).toBe("return-to-home");

    const moved = await json<{ requeued: boolean; buildId: number }>(await c.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: b } }), 200);
    expect(moved).toMatchObject({ requeued: true, buildId: b });
    expect((await settledRun(c, up.runId)).status).toBe("ready");
    const run = (await json<{ run: { buildId: number; summary: { failsafe: { plan: { action: string }; result: string } } } }>(await c.get(`/api/runs/${up.runId}`), 200)).run;
    expect(run.buildId).toBe(b);
    expect(run.summary.failsafe.plan.action).toBe("hold");
    expect(run.summary.failsafe.result).toBe("wrong-action");

    const check = (await json<{ check: { findings: Finding[]; evidence: { runs: number; runsWithRc: number } } }>(await c.get(`/api/builds/${b}/check`), 200)).check;
    expect(check.evidence).toEqual({ runs: 1, runsWithRc: 1 });
    expect(check.findings.find((f) => f.rule === "logs-failsafe-action")?.runIds).toEqual([up.runId]);
    expect(check.findings.find((f) => f.rule === "logs-rssi-follows-sticks")?.channels).toEqual([8]);
    // Build A no longer has the run: nothing from logs there.
    expect((await json<{ check: { evidence: { runs: number } } }>(await c.get(`/api/builds/${a}/check`), 200)).check.evidence.runs).toBe(0);

    // Same build again: nothing to do. Retired builds and other crews' builds are refused.
    expect((await json<{ requeued: boolean }>(await c.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: b } }), 200)).requeued).toBe(false);
    await json(await c.post(`/api/builds/${a}/retire`, { retired: true }), 200);
    await json(await c.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: a } }), 422);
    const other = await newLead("builds-other");
    const o = new Client();
    expect(await o.signIn(other.email, testPassword)).toBeNull();
    const foreign = (await json<{ id: number }>(await o.post("/api/builds", { crewId: other.crewId, name: "Theirs", vehicleType: "ground" }), 201)).id;
    await json(await c.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: foreign } }), 404);
    await json(await c.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: null } }), 200);
    expect((await settledRun(c, up.runId)).status).toBe("ready");
  });

  it("lets only leads write; pilots move their own runs; other crews see nothing", { timeout: 90_000 }, async () => {
    const id = await newBuild("Roles");
    const pilot = await join(lead, "pilot");
    const observer = await join(lead, "observer");

    for (const who of [pilot, observer]) {
      await json(await who.get(`/api/builds/${id}`), 200);
      await json(await who.get(`/api/builds/${id}/check`), 200);
      await json(await who.get(`/api/builds/${id}/history`), 200);
      await json(await who.get(`/api/builds/${id}/photos`), 200);
      await json(await who.request(`/api/builds/${id}`, { method: "PUT", json: { name: "Mine now" } }), 403);
      await json(await who.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet() } }), 403);
      await json(await who.post(`/api/builds/${id}/retire`, { retired: true }), 403);
      await json(await who.post(`/api/builds/${id}/photos`, { fileName: "p.png", contentType: "image/png", size: 10 }), 403);
    }

    const other = await newLead("builds-outsider");
    const o = new Client();
    expect(await o.signIn(other.email, testPassword)).toBeNull();
    await json(await o.get(`/api/builds/${id}`), 404);
    await json(await o.get(`/api/builds/${id}/check`), 404);
    await json(await o.request(`/api/builds/${id}`, { method: "PUT", json: { name: "Ours" } }), 404);
    await json(await o.request(`/api/builds/${id}/link-sheet`, { method: "PUT", json: { channels: roverSheet() } }), 404);
    await json(await o.post(`/api/builds/${id}/retire`, { retired: true }), 404);
    await json(await o.post(`/api/builds/${id}/photos`, { fileName: "p.png", contentType: "image/png", size: 10 }), 404);

    // The pilot's own run may be moved by the pilot, not by the observer or another crew.
    const second = await newBuild("Roles two");
    const up = await uploadLog(pilot, "pilot-run.csv", toCsv(simulateRun({ seed: 9, waypoints: demoCrew.routePlans[0].waypoints })), { crewId: lead.crewId, buildId: id });
    expect((await settledRun(pilot, up.runId)).status).toBe("ready");
    await json(await observer.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: second } }), 403);
    await json(await o.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: second } }), 404);
    await json(await pilot.request(`/api/runs/${up.runId}/build`, { method: "PUT", json: { buildId: second } }), 200);
    expect((await settledRun(pilot, up.runId)).status).toBe("ready");
    // A run the pilot did not upload: only a lead moves it.
    const leads = await uploadLog(c, "lead-run.csv", toCsv(simulateRun({ seed: 13, waypoints: demoCrew.routePlans[0].waypoints })), { crewId: lead.crewId, buildId: id });
    expect((await settledRun(c, leads.runId)).status).toBe("ready");
    await json(await pilot.request(`/api/runs/${leads.runId}/build`, { method: "PUT", json: { buildId: second } }), 403);
  });
});
