/**
 * Issue 12, point 6 — "Evidence, not absence" (DESIGN.md §10): a GPX track has positions,
 * satellites and HDOP but no link metric, no voltage and no arming. The verdict may only speak for
 * what the log shows: the link and the failsafe (and the battery, and the route without a plan) are
 * not assessed, each with a reason, and never "held". No tolerances: these are categorical facts.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { gpxNoLinkScenario } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, type AnalysedLog } from "./analyse-log";
import { expectWithin, notAssessedParts } from "./expect-within";
import { geodesicM } from "./geodesic";

describe("scenario: a GPX track with no link data", () => {
  const sc = gpxNoLinkScenario();
  const tl = sc.timeline;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("has no link metric and no source for one", () => {
    expect(a.format).toBe("gpx");
    expect(a.summary.link.metric).toBeNull();
    expect(a.summary.link.source ?? null).toBeNull();
    expect(a.of("link-lost")).toHaveLength(0);
    expect(a.of("link-fade")).toHaveLength(0);
  });

  it("lists the link and the failsafe as not assessed, with a reason each, and never as held", () => {
    const parts = notAssessedParts(a.summary);
    expect(parts).toEqual(expect.arrayContaining(["link", "failsafe"]));
    for (const x of a.summary.verdict.notAssessed) expect(x.why, x.what).toMatch(/\w/);
    expect(a.summary.verdict.held).not.toContain("link");
    expect(a.summary.verdict.held).not.toContain("failsafe");
  });

  it("reports the failsafe as not assessed, saying why", () => {
    expect(a.summary.failsafe.result).toBe("not-assessed");
    expect(a.summary.failsafe.why).toMatch(/\w/);
    expect(a.summary.failsafe.commanded ?? null).toBeNull();
    expect(a.summary.failsafe.flown ?? null).toBeNull();
  });

  it("also lists the battery (no voltage) and the route (no plan) as not assessed; the GPS fix, which it shows, held", () => {
    expect(notAssessedParts(a.summary).sort()).toEqual(["battery", "failsafe", "link", "route"]);
    expect(a.summary.verdict.held).toEqual(["gps"]);
    expect(a.summary.verdict.level).toBe("clear");
    expect(a.summary.verdict.reasons).toEqual([]);
  });

  it("is not a bench log: home at the first good fix, the track measured (GeographicLib)", () => {
    expect(a.summary.bench).toBe(false);
    expect(a.summary.home?.source).toBe("first-good-fix");
    // 5 σ of the simulated GPS noise (σ 0.4 m per axis: 2 m). The loop's far corner is 64 m from
    // the start (a sample falls on it); home and that fix may each be 2 m off: 4 m.
    const fixM = 5 * tl.gpsSigmaM;
    expect(geodesicM(a.summary.home, tl.start)).toBeLessThanOrEqual(fixM);
    expectWithin(a.summary.maxDistanceFromHomeM, tl.farthestM, 2 * fixM, "maxDistanceFromHomeM");
  });
});
