/**
 * Issue 12, point 1 — "Home is where the vehicle was armed" (DESIGN.md §10, common practice): the
 * crew powers up at the car (a cold start: HDOP 18 → 5, 4–5 satellites, the position converging
 * from 25 m off), waits for good fixes, carries the rover 70 m to the launch point, arms it there
 * and drives a diamond whose far corner is 40 m from the launch point (~106 m from the car).
 * Home needs a good fix: ≥ 6 satellites and HDOP ≤ 2.5 (the contract's defaults).
 *
 * Expected values: positions and distances with GeographicLib (Karney 2013, J. Geodesy 87:43–55)
 * from the scenario's true launch point and the fixes as written; times from its timeline.
 * Tolerances:
 * - home position: 2 m = 5 σ of the simulated GPS noise (σ 0.4 m per axis);
 * - home time: one sample interval (0.1 s in the CSV, 1 s in the 1 Hz GPX);
 * - farthest from home: the same 2 m (the distances are measured from the home fix, which lies
 *   within 2 m of the launch point; triangle inequality), plus 0.1 m for the summary's rounding.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { walkToLaunchScenario } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, type AnalysedLog } from "./analyse-log";
import { expectWithin } from "./expect-within";
import { geodesicM } from "./geodesic";

describe("scenario: fix at the car, a 70 m walk, armed at the launch point (CSV with an armed flag)", () => {
  const sc = walkToLaunchScenario();
  const tl = sc.timeline;
  const homeTolM = 5 * tl.gpsSigmaM;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("places home at the first good fix at or after arming, at the launch point, not at the car", () => {
    const home = a.summary.home;
    expect(home?.source).toBe("arming");
    expectWithin(home.tS, tl.armS, 1 / tl.hz, "home.tS");
    expect(geodesicM(home, tl.launch)).toBeLessThanOrEqual(homeTolM);
    expect(geodesicM(home, tl.car)).toBeGreaterThan(tl.walkM - homeTolM);
  });

  it("reports the satellites and HDOP of the fix that placed home, as logged", () => {
    const atArming = sc.samples.find((s) => s.t >= tl.armS)!;
    expect(a.summary.home.sats).toBe(atArming.sats);
    expect(a.summary.home.hdop).toBeCloseTo(atArming.hdop, 2);
  });

  it("measures the farthest point from the launch point (40 m), not from the car (~106 m)", () => {
    // Every fix from arming on, as written in the log (7 decimals), measured from the true launch point.
    const fromLaunch = sc.samples.filter((s) => s.t >= tl.armS).map((s) => geodesicM({ lat: Number(s.lat.toFixed(7)), lon: Number(s.lon.toFixed(7)) }, tl.launch));
    const expected = Math.max(...fromLaunch);
    expect(expected).toBeGreaterThan(39); // the diamond's far corner, 40 m out
    expectWithin(a.summary.maxDistanceFromHomeM, expected, homeTolM + 0.1, "maxDistanceFromHomeM");
  });

  it("counts GPS quality from home on: the cold start at the car is neither an HDOP warning nor a lost fix", () => {
    expect(a.summary.gps.hdopWarnS).toBe(0);
    expect(a.summary.gps.fixLostS).toBe(0);
    expect(a.of("fix-lost")).toHaveLength(0);
    expect(a.of("position-jump")).toHaveLength(0);
    expect(a.summary.verdict.reasons.filter((r: string) => /HDOP|GPS/i.test(r))).toEqual([]);
    expect(a.summary.verdict.held).toContain("gps");
  });
});

describe("scenario: the same session as a 1 Hz GPX track (no armed flag)", () => {
  const sc = walkToLaunchScenario({ format: "gpx" });
  const tl = sc.timeline;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("places home at the first good fix (≥ 6 satellites, HDOP ≤ 2.5) and says so; the cold-start fixes do not count", () => {
    const home = a.summary.home;
    expect(home?.source).toBe("first-good-fix");
    expectWithin(home.tS, tl.goodFixS, 1 / tl.hz, "home.tS");
    expect(geodesicM(home, tl.car)).toBeLessThanOrEqual(5 * tl.gpsSigmaM);
    expect(home.sats).toBeGreaterThanOrEqual(6);
    expect(home.hdop).toBeLessThanOrEqual(2.5);
  });
});
