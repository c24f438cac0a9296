/**
 * Issue 12, point 2 — "A mission starts from wherever the vehicle is" (DESIGN.md §10, common
 * practice): plan P1…P4 with P4 = home; the rover is armed at home, the mission engaged there, and
 * it drives ~60 m straight to P1, then round the plan back home. Expected values: times from the
 * scenario's timeline, geometry with GeographicLib (Karney 2013, J. Geodesy 87:43–55).
 *
 * Tolerances:
 * - times: one sample interval (0.1 s at 10 Hz) — an event starts at a sample;
 * - positions: 1.5 m = 5 σ of the simulated GPS noise (σ 0.3 m per axis; a 2-D radius beyond 5 σ has
 *   probability e^(−12.5) ≈ 4·10⁻⁶);
 * - "waypoint reached" start: when the true path enters the 2 m acceptance radius (ground default,
 *   DESIGN.md §5), ± 0.5 s (noise of 0.3 m at 2 m/s moves the entry by 0.15 s per σ).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { launchPointScenario, type MissionSignal } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, type AnalysedLog } from "./analyse-log";
import { expectBetween, expectWithin } from "./expect-within";
import { geodesicM } from "./geodesic";

const ACCEPTANCE_RADIUS_M = 2; // DESIGN.md §5, ground default

describe.each<[MissionSignal, string]>([
  ["mode", "mission mode text (AUTO)"],
  ["channel", "the link sheet's mission channel only (ch6 in 1800–2100 µs)"],
  ["movement", "neither: the first movement after arming"],
])("scenario: launch point ≠ waypoint 1, mission start shown by %s", (signal, how) => {
  const sc = launchPointScenario({ missionSignal: signal });
  const tl = sc.timeline;
  const sampleS = 1 / tl.hz;
  const gpsM = 5 * tl.gpsSigmaM;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build, sc.plan);
  });

  it(`route following starts at the mission start (${how}), where the rover was armed`, () => {
    const start = a.summary.route?.start;
    expect(start, "summary.route.start").toBeTruthy();
    expect(start.source).toBe(signal);
    if (signal === "movement") {
      // Movement shows only once the rover has gone somewhere: allow up to 3 s (6 m at 2 m/s), our bound.
      expectBetween(start.startS, tl.engageS - sampleS, tl.engageS + 3, "route.start.startS");
      expect(geodesicM(start, tl.launch)).toBeLessThanOrEqual(3 * tl.speedMps + gpsM);
    } else {
      expectWithin(start.startS, tl.engageS, sampleS, "route.start.startS");
      expect(geodesicM(start, tl.launch)).toBeLessThanOrEqual(gpsM);
    }
  });

  it('runs the first leg from "Start" to P1 and the rest of the legs as planned', () => {
    expect(a.summary.route.legs.map((l: { from: string; to: string }) => `${l.from}→${l.to}`)).toEqual(["Start→P1", "P1→P2", "P2→P3", "P3→P4"]);
  });

  it("reaches P1 on the first leg, and all four waypoints in order; misses none", () => {
    expect(a.summary.route.waypointsReached).toEqual(["P1", "P2", "P3", "P4"]);
    expect(a.summary.route.waypointsMissed).toEqual([]);
    expect(a.summary.route.waypointsNotReached).toEqual([]);
    expect(a.of("waypoint-missed")).toHaveLength(0);
    const reached = a.of("waypoint-reached");
    expect(reached.map((e) => e.detail.waypoint)).toEqual(["P1", "P2", "P3", "P4"]);
    const entersP1 = tl.arriveS.P1 - ACCEPTANCE_RADIUS_M / tl.speedMps;
    expectWithin(reached[0].startS, entersP1, 0.5, "P1 reached at");
  });

  it("measures the first leg against the line Start → P1, which the rover drove: only GPS noise off it", () => {
    const leg = a.summary.route.legs[0];
    expectBetween(leg.maxXteM, 0, gpsM, "legs[0].maxXteM");
    // RMS of white noise σ 0.3 m is 0.3 m; ± 0.15 m covers the scatter of a few hundred samples.
    expectWithin(leg.rmsXteM, tl.gpsSigmaM, 0.15, "legs[0].rmsXteM");
  });

  it("finds no off-route; the verdict is clear, the route held, and only the failsafe (no loss) is not assessed", () => {
    expect(a.of("off-route")).toHaveLength(0);
    expect(a.summary.verdict.level).toBe("clear");
    expect(a.summary.verdict.reasons).toEqual([]);
    expect(a.summary.verdict.held).toEqual(expect.arrayContaining(["route", "link", "battery", "gps"]));
    expect(a.summary.verdict.notAssessed.map((x: { what: string }) => x.what)).toEqual(["failsafe"]);
  });

  it("places home where the rover was armed", () => {
    const home = a.summary.home;
    expect(home?.source).toBe("arming");
    expectWithin(home.tS, tl.armS, sampleS, "home.tS");
    expect(geodesicM(home, tl.launch)).toBeLessThanOrEqual(gpsM);
  });
});
