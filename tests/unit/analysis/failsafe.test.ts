import { describe, expect, it } from "vitest";
import { analyseFailsafe } from "@/lib/analysis/failsafe";
import { analyseLink } from "@/lib/analysis/link";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import type { AnalysisEvent, BuildConfig, FailsafeAction } from "@/lib/analysis/types";
import { frozenCopy, makeSeries, rcColumn, type SeriesField, type SeriesValues } from "@/tests/helpers/series";

// Every series here is synthetic, written for these tests (our own data). 10 Hz: sample i at i/10 s.
const th = defaultThresholds("ground");
const MODES = ["MANUAL", "RTH", "LAND", "HOLD"];
const plan = (action: FailsafeAction, expectedWithinS: number, extra: Partial<BuildConfig> = {}): BuildConfig => ({
  vehicleType: "ground", failsafe: { action, expectedWithinS }, ...extra,
});
/** A link-lost event shaped as analyseLink reports it. */
const lost = (startS: number, endS: number): AnalysisEvent => ({
  kind: "link-lost", startS, endS, lat: null, lon: null, distanceFromHomeM: null, peak: 0, threshold: 0, detail: {},
});
/** 10 s: armed 0.5–9.5 s, driving at 5 m/s in MANUAL unless a field says otherwise. */
const run = (f: Partial<Record<SeriesField, SeriesValues>> = {}) =>
  makeSeries(100, { armed: (i) => (i >= 5 && i < 95 ? 1 : 0), speedMps: () => 5, modeIndex: () => 0, ...f }, { modeNames: MODES });
/** Mode `mode` over samples [from, to), MANUAL elsewhere. */
const modeOver = (mode: number, from: number, to = 60) => (i: number) => (i >= from && i < to ? mode : 0);
const LOSS = [lost(2, 6)]; // link lost 2.0–6.0 s

describe("analyseFailsafe", () => {
  it("passes when the planned RTH mode comes within the planned delay, with its events in order", () => {
    const r = analyseFailsafe(run({ modeIndex: modeOver(1, 25) }), LOSS, plan("return-to-home", 1), th);
    expect(r.outcome).toBe("pass");
    expect(r.decisive).toMatchObject({
      commanded: null, flown: { state: "seen", by: "mode", action: "return-to-home", atS: 2.5, latencyS: 0.5, mode: "RTH" },
      failsafeStartS: 2.5, failsafeLatencyS: 0.5, actionLatencyS: 0.5, action: "return-to-home", outcome: "pass",
    });
    expect(r.events.map((e) => [e.kind, e.startS, e.endS])).toEqual([
      ["armed", 0.5, 0.5],
      ["failsafe", 2.5, 6],
      ["return-to-home", 2.5, 6],
      ["disarmed", 9.5, 9.5],
    ]);
    expect(r.events[1]).toMatchObject({ peak: 0.5, threshold: 1 });
  });

  it("passes at exactly the planned delay and is late just past it", () => {
    const s = run({ modeIndex: modeOver(1, 25) });
    expect(analyseFailsafe(s, LOSS, plan("return-to-home", 0.5), th).outcome).toBe("pass");
    expect(analyseFailsafe(s, LOSS, plan("return-to-home", 0.4), th).outcome).toBe("late");
  });

  it("reports the flag as commanded and the mode as flown, judging lateness on the flown mode", () => {
    const s = run({ failsafe: (i) => (i >= 23 && i < 60 ? 1 : 0), modeIndex: modeOver(1, 25) });
    const r = analyseFailsafe(s, LOSS, plan("return-to-home", 0.4), th);
    expect(r.decisive).toMatchObject({
      commanded: { by: "flag", channel: null, latencyS: expect.closeTo(0.3, 9) },
      flown: { state: "seen", by: "mode", latencyS: 0.5 },
      failsafeLatencyS: expect.closeTo(0.3, 9), actionLatencyS: 0.5, outcome: "late",
    });
    expect(r.events.find((e) => e.kind === "failsafe")).toMatchObject({ startS: 2.3, endS: 6 });
  });

  it("reports wrong-action when the vehicle lands but the plan says return home", () => {
    const r = analyseFailsafe(run({ modeIndex: modeOver(2, 25) }), LOSS, plan("return-to-home", 1), th);
    expect(r.outcome).toBe("wrong-action");
    expect(r.decisive?.action).toBe("land");
    expect(r.events.some((e) => e.kind === "return-to-home")).toBe(false);
  });

  it("reports wrong-action when the receiver commanded RTH but the logged mode never changed", () => {
    const build = plan("return-to-home", 1, { channels: [{ channel: 6, function: "return-to-home", failsafeUs: 1900 }] });
    const s = run({ rc: rcColumn(100, { 6: (i) => (i >= 24 ? 1900 : 1100) }) });
    const r = analyseFailsafe(s, LOSS, build, th);
    expect(r.decisive).toMatchObject({ commanded: { by: "rc-channel", channel: 6, latencyS: expect.closeTo(0.4, 9) }, flown: { state: "none", by: "mode" }, outcome: "wrong-action" });
  });

  it("reports not-triggered when nothing happens during a loss longer than the planned delay", () => {
    const r = analyseFailsafe(run(), LOSS, plan("hold", 1), th);
    expect(r.outcome).toBe("not-triggered");
    expect(r.decisive).toMatchObject({ commanded: null, flown: { state: "none", by: "mode" }, failsafeStartS: null, action: "none" });
    expect(r.events.map((e) => e.kind)).toEqual(["armed", "disarmed"]);
  });

  it("does not judge a loss shorter than the planned delay when nothing fired (not assessed)", () => {
    const r = analyseFailsafe(run(), [lost(2, 2.5)], plan("hold", 1), th);
    expect(r.outcome).toBe("not-assessed");
    expect(r.why).toMatch(/planned 1 s/);
    expect(r.losses[0].outcome).toBe("not-due");
  });

  it("is not assessed without any link loss, and ignores events of other kinds", () => {
    const fade = { ...lost(2, 6), kind: "link-fade" as const };
    expect(analyseFailsafe(run({ modeIndex: modeOver(1, 25) }), [fade], plan("hold", 1), th)).toMatchObject({
      outcome: "not-assessed", why: "no link loss in this run to exercise it", decisive: null, losses: [],
    });
  });

  it("is not assessed for a loss on a build without a failsafe plan, still saying what happened", () => {
    const r = analyseFailsafe(run({ modeIndex: modeOver(1, 25) }), LOSS, undefined, th);
    expect(r).toMatchObject({ outcome: "not-assessed", why: expect.stringMatching(/no failsafe plan/), plan: null });
    expect(r.decisive).toMatchObject({ action: "return-to-home", failsafeLatencyS: 0.5, flown: { state: "seen", by: "mode" } });
  });

  it("reads the commanded failsafe from the return-to-home channel reaching its failsafe value ±25 µs", () => {
    const build = plan("return-to-home", 1, { channels: [{ channel: 6, function: "Return-to-home", failsafeUs: 1900 }] });
    const rc = (us: number) => rcColumn(100, { 6: (i) => (i >= 28 ? us : 1100) });
    expect(analyseFailsafe(run({ rc: rc(1925) }), LOSS, build, th).decisive).toMatchObject({ commanded: { by: "rc-channel", channel: 6, atS: 2.8 }, failsafeStartS: 2.8 });
    expect(analyseFailsafe(run({ rc: rc(1875) }), LOSS, build, th).decisive?.commanded?.by).toBe("rc-channel");
    expect(analyseFailsafe(run({ rc: rc(1926) }), LOSS, build, th).decisive?.commanded).toBeNull();
    // Already at the failsafe value before the loss: the pilot's switch, not the receiver's failsafe.
    const before = rcColumn(100, { 6: (i) => (i >= 10 ? 1900 : 1100) });
    expect(analyseFailsafe(run({ rc: before }), LOSS, build, th).decisive?.commanded).toBeNull();
  });

  it("takes a mode channel's failsafe value as commanded too (a receiver that selects the failsafe mode)", () => {
    const build = plan("land", 1, { channels: [{ channel: 5, function: "mode", failsafeUs: 1000 }] });
    const r = analyseFailsafe(run({ rc: rcColumn(100, { 5: (i) => (i >= 23 && i < 60 ? 1000 : 1500) }), modeIndex: modeOver(2, 26) }), LOSS, build, th);
    expect(r.decisive).toMatchObject({ commanded: { by: "rc-channel", channel: 5 }, flown: { state: "seen", action: "land" }, outcome: "pass" });
  });

  // DESIGN.md §10: "a missing mode column means 'flown: not logged', never 'wrong action'".
  it("on a bench (no mode column, no fix) reports flown not logged and judges the command", () => {
    const build = plan("return-to-home", 1, { channels: [{ channel: 8, function: "return-to-home", failsafeUs: 1900 }] });
    const s = makeSeries(100, { armed: () => 1, voltageV: () => 16, rc: rcColumn(100, { 8: (i) => (i >= 24 && i < 60 ? 1900 : 1000) }) });
    const r = analyseFailsafe(s, LOSS, build, th);
    expect(r.decisive).toMatchObject({ commanded: { by: "rc-channel", channel: 8, latencyS: expect.closeTo(0.4, 9) }, flown: { state: "not-logged" }, outcome: "pass" });
    expect(analyseFailsafe(s, LOSS, plan("return-to-home", 0.3, { channels: build.channels }), th).outcome).toBe("late");
  });

  it("is not assessed when nothing in the log could show a failsafe", () => {
    const s = makeSeries(100, { armed: () => 1, voltageV: () => 16, rssiPct: (i) => (i >= 20 && i < 60 ? 0 : 90) });
    const r = analyseFailsafe(s, LOSS, plan("return-to-home", 1), th);
    expect(r).toMatchObject({ outcome: "not-assessed", why: expect.stringMatching(/nothing in the log can show a failsafe/) });
    expect(r.decisive?.flown).toEqual({ state: "not-logged" });
  });

  it("reads the action from the track when there is no mode text: distance from home falling → RTH", () => {
    const s = run({ modeIndex: () => NaN, failsafe: (i) => (i >= 22 && i < 60 ? 1 : 0), lat: () => 47.4, lon: () => 8.5 });
    const home = Float64Array.from({ length: 100 }, (_, i) => (i < 22 ? 100 : Math.max(0, 100 - (i - 22) * 2)));
    const r = analyseFailsafe(s, LOSS, plan("return-to-home", 1), th, { distanceFromHome: home });
    expect(r.decisive).toMatchObject({ commanded: { by: "flag" }, flown: { state: "seen", by: "track", action: "return-to-home" }, action: "return-to-home", outcome: "pass" });
    const rth = r.events.find((e) => e.kind === "return-to-home");
    expect(rth).toMatchObject({ startS: 2.2, endS: 6, distanceFromHomeM: 100, detail: { source: "behaviour" } });
  });

  it("reads hold from a stop and land from a descent to the ground (the log's first altitude)", () => {
    const flag = (i: number) => (i >= 22 && i < 60 ? 1 : 0);
    const fix = { lat: () => 47.4, lon: () => 8.5 };
    const stop = run({ modeIndex: () => NaN, failsafe: flag, speedMps: (i) => (i < 22 ? 5 : 0), ...fix });
    expect(analyseFailsafe(stop, LOSS, plan("hold", 1), th).decisive).toMatchObject({ flown: { state: "seen", by: "track", action: "hold", atS: 2.2 }, outcome: "pass" });
    const descend = run({ modeIndex: () => NaN, failsafe: flag, speedMps: () => 0, altM: (i) => (i < 10 ? 100 : i < 22 ? 120 : Math.max(100, 120 - (i - 22))), ...fix });
    expect(analyseFailsafe(descend, LOSS, plan("land", 1), th).decisive).toMatchObject({ action: "land", outcome: "pass" });
  });

  it("does not take a mode the pilot chose before the loss as the failsafe", () => {
    const r = analyseFailsafe(run({ modeIndex: modeOver(1, 10) }), LOSS, plan("return-to-home", 1), th);
    expect(r.decisive).toMatchObject({ commanded: null, failsafeStartS: null, outcome: "not-triggered" });
    expect(r.events.find((e) => e.kind === "return-to-home")).toMatchObject({ startS: 1, endS: 6, detail: { source: "mode", mode: "RTH" } });
  });

  it("matches mode names case-insensitively", () => {
    const s = makeSeries(100, { modeIndex: modeOver(1, 25), speedMps: () => 5 }, { modeNames: ["acro", "Return To Home"] });
    expect(analyseFailsafe(s, LOSS, plan("return-to-home", 1), th).outcome).toBe("pass");
  });

  it("takes the worst outcome over several losses", () => {
    const s = run({ modeIndex: modeOver(1, 25, 40) });
    const r = analyseFailsafe(s, [lost(6.5, 9), lost(2, 4)], plan("return-to-home", 1), th);
    expect(r.losses.map((l) => [l.lossStartS, l.outcome])).toEqual([[2, "pass"], [6.5, "not-triggered"]]);
    expect(r.outcome).toBe("not-triggered");
    expect(r.decisive?.lossStartS).toBe(6.5);
  });

  it("works on the link-lost events analyseLink gives for a failsafe flag", () => {
    const s = run({ lqPct: (i) => (i >= 20 && i < 60 ? 0 : 100), failsafe: (i) => (i >= 24 && i < 60 ? 1 : 0), modeIndex: modeOver(1, 26) });
    const link = analyseLink(s, th);
    const r = analyseFailsafe(s, link.events, plan("return-to-home", 1), th);
    expect(r.decisive).toMatchObject({ lossStartS: 2, commanded: { by: "flag" }, failsafeLatencyS: expect.closeTo(0.4, 9), actionLatencyS: expect.closeTo(0.6, 9), outcome: "pass" });
  });

  it("places the failsafe event where it started", () => {
    const s = run({ modeIndex: modeOver(1, 25), lat: (i) => 50 + i / 100, lon: () => 8 });
    expect(analyseFailsafe(s, LOSS, plan("return-to-home", 1), th).events.find((e) => e.kind === "failsafe")).toMatchObject({ lat: 50.25, lon: 8 });
  });

  it("emits armed/disarmed only at flag changes (a log that starts armed has no armed event)", () => {
    const s = makeSeries(6, { armed: [1, 1, NaN, 0, 0, 1] });
    expect(analyseFailsafe(s, [], undefined, th).events.map((e) => [e.kind, e.startS])).toEqual([["disarmed", 0.3], ["armed", 0.5]]);
  });

  it("handles an empty series and one sample", () => {
    expect(analyseFailsafe(makeSeries(0), [], plan("hold", 1), th)).toEqual({
      outcome: "not-assessed", why: "no link loss in this run to exercise it", plan: { action: "hold", expectedWithinS: 1 }, decisive: null, losses: [], events: [],
    });
    const one = analyseFailsafe(makeSeries(1, { armed: [1] }), [lost(0, 0)], plan("hold", 1), th);
    expect(one.outcome).toBe("not-assessed");
    expect(analyseFailsafe(makeSeries(0), [lost(0, 5)], plan("hold", 1), th).outcome).toBe("not-assessed");
  });

  it("leaves its inputs untouched (frozen copies give the same result)", () => {
    const s = run({ failsafe: (i) => (i >= 23 && i < 60 ? 1 : 0), modeIndex: modeOver(1, 25) });
    const losses = Object.freeze(LOSS.map((e) => Object.freeze({ ...e })));
    const r = analyseFailsafe(s, losses as AnalysisEvent[], plan("return-to-home", 1), th);
    expect(analyseFailsafe(frozenCopy(s), losses as AnalysisEvent[], plan("return-to-home", 1), th)).toEqual(r);
    expect(losses.map((e) => e.startS)).toEqual([2]);
  });
});
