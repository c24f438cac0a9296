import { describe, expect, it } from "vitest";
import { findMissionStart, isMissionModeName, MOVE_START_M } from "@/lib/analysis/mission-start";
import { analyseRoute } from "@/lib/analysis/route";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { analyseTrack } from "@/lib/analysis/track";
import type { RoutePlanInput } from "@/lib/analysis/types";
import { crossTrack } from "@/lib/analysis/geodesy";
import { makeSeries, rcColumn } from "@/tests/helpers/series";
import { offset, toLatLon, walk } from "./geo-path";

// Synthetic runs written for these tests (our own data) on an invented field, metres east/north of
// its origin, 10 Hz. DESIGN.md §10 "A mission starts from wherever the vehicle is": plans rarely
// list home, so the first leg runs from the vehicle's position at the mission start to waypoint 1.
const th = defaultThresholds("ground"); // radius 2 m, corridor 3 m for ≥ 2 s

const plan = (pts: [string, number, number][]): RoutePlanInput => ({ waypoints: pts.map(([name, e, n]) => ({ name, ...offset(e, n) })) });
/**
 * P1…P4 with P4 = home (the launch point at the origin), P1 60 m north of it and the first plan
 * leg P1→P2 running east: home lies abeam of P1, which is what made P1 "missed" on the first second.
 */
const P = plan([["P1", 0, 60], ["P2", 60, 60], ["P3", 60, 0], ["P4", 0, 0]]);

/** Sits 3 s at the launch point, then drives the plan at 3 m/s from there. */
function mission(extra: Parameters<typeof makeSeries>[1] = {}, modeNames: string[] = []) {
  const p = walk([[0, 0], [0, 60], [60, 60], [60, 0], [0, 0]], 3, 10);
  const e = [...Array(30).fill(0), ...p.e];
  const n = [...Array(30).fill(0), ...p.n];
  return makeSeries(e.length, { ...toLatLon(e, n), sats: () => 11, hdop: () => 0.8, armed: () => 1, ...extra }, { modeNames });
}
const startOf = (s: ReturnType<typeof mission>, build?: Parameters<typeof findMissionStart>[1]) => {
  const t = analyseTrack(s, th);
  return { t, m: findMissionStart(s, build, { homeIndex: t.home!.index, usableFix: t.usableFix, distanceFromHomeM: t.distanceFromHomeM }) };
};

describe("isMissionModeName", () => {
  it("reads mission modes by whole word, and not a failsafe action or a longer word", () => {
    for (const name of ["AUTO", "Auto", "MISSION", "NAV WP", "Waypoint", "nav_wp"]) expect(isMissionModeName(name), name).toBe(true);
    for (const name of ["AUTOTUNE", "MANUAL", "AUTO RTL", "RTH", "HOLD", "wpt"]) expect(isMissionModeName(name), name).toBe(false);
  });
});

describe("findMissionStart", () => {
  it("starts where a mission mode was engaged, and gives the engaged mask", () => {
    const s = mission({ modeIndex: (i) => (i < 20 ? 0 : 1) }, ["MANUAL", "AUTO"]);
    const { m } = startOf(s);
    expect(m).toMatchObject({ index: 20, source: "mode" });
    expect(m.engaged![19]).toBe(0);
    expect(m.engaged![20]).toBe(1);
  });

  it("starts where the link sheet's mission channel enters its engage range, when no mode says so", () => {
    const build = { vehicleType: "ground" as const, channels: [{ channel: 6, function: "mission", engageMinUs: 1400, engageMaxUs: 1600 }] };
    const base = mission();
    const s = mission({ rc: rcColumn(base.n, { 6: (i) => (i < 25 ? 1000 : 1500) }) });
    expect(startOf(s, build).m).toMatchObject({ index: 25, source: "channel" });
    // Without an engage range the channel says nothing: first movement instead.
    const noRange = { vehicleType: "ground" as const, channels: [{ channel: 6, function: "mission" }] };
    expect(startOf(s, noRange).m.source).toBe("movement");
  });

  it("falls back to the last fix within 5 m of home before the vehicle first left it, starting the leg at home", () => {
    const s = mission();
    const { t, m } = startOf(s);
    expect(m.source).toBe("movement");
    expect(m.engaged).toBeNull();
    expect(t.distanceFromHomeM[m.index]).toBeLessThanOrEqual(MOVE_START_M);
    expect(t.distanceFromHomeM[m.index + 1]).toBeGreaterThan(MOVE_START_M);
    expect(m.position).toEqual({ lat: s.lat[t.home!.index], lon: s.lon[t.home!.index] });
  });

  it("is home itself for a vehicle that never moved, and nothing without a fix", () => {
    const still = makeSeries(30, { ...toLatLon(Array(30).fill(0), Array(30).fill(0)), armed: () => 1 });
    const t = analyseTrack(still, th);
    expect(findMissionStart(still, undefined, { homeIndex: t.home!.index, usableFix: t.usableFix, distanceFromHomeM: t.distanceFromHomeM })).toMatchObject({ index: 0, source: "movement" });
    expect(findMissionStart(still, undefined, { homeIndex: -1, usableFix: t.usableFix, distanceFromHomeM: t.distanceFromHomeM })).toEqual({ index: -1, position: null, source: null, engaged: null });
  });
});

describe("analyseRoute from the mission start", () => {
  it("runs the first leg from the launch point to P1: no off-route, P1 reached, every waypoint reached", () => {
    const s = mission({ modeIndex: (i) => (i < 20 ? 0 : 1) }, ["MANUAL", "AUTO"]);
    const { t, m } = startOf(s);
    const start = { index: m.index, lat: s.lat[m.index], lon: s.lon[m.index] };
    const r = analyseRoute(s, P, th, { usableFix: t.usableFix, distanceFromHome: t.distanceFromHomeM, home: t.home, start });
    expect(r.reached).toEqual(["P1", "P2", "P3", "P4"]);
    expect(r.missed).toEqual([]);
    expect(r.events.filter((e) => e.kind === "off-route")).toEqual([]);
    expect(r.legs.map((l) => [l.from, l.to])).toEqual([["Start", "P1"], ["P1", "P2"], ["P2", "P3"], ["P3", "P4"]]);
    // First leg: launch point → P1, 60 m; the drive follows it exactly.
    expect(r.legs[0].lengthM).toBeCloseTo(60, 1);
    expect(r.legs[0].maxXteM!).toBeLessThan(0.05);
    expect(r.events.find((e) => e.kind === "waypoint-reached")!.detail).toMatchObject({ waypoint: "P1", index: 0 });
    // Nothing before the start is followed.
    expect(r.activeLeg[m.index - 1]).toBe(-1);
    expect(r.activeLeg[m.index]).toBe(0);
  });

  it("without a start measures the first seconds against P1→P2 (the behaviour the start fixes)", () => {
    const s = mission();
    const t = analyseTrack(s, th);
    const r = analyseRoute(s, P, th, { usableFix: t.usableFix, home: t.home });
    expect(r.missed).toContain("P1");
    expect(r.xteM[0]).toBeCloseTo(60, 0); // home is 60 m off the P1→P2 line
  });

  it("takes waypoint 1 as reached at the start when the mission starts within its radius + 3 m (GPS scatter)", () => {
    // A plan listing home as waypoint 1; the vehicle stands 4 m from it (radius 2 m) and drives off east.
    const H = plan([["Home", 0, 0], ["East", 60, 0]]);
    const p = walk([[0, 4], [10, 0], [65, 0]], 3, 10);
    const s = makeSeries(p.e.length, { ...toLatLon(p.e, p.n), armed: () => 1 });
    const t = analyseTrack(s, th);
    const at = (snapFrom: [number, number]) => ({ index: 0, ...toLatLon([snapFrom[0]], [snapFrom[1]]) });
    const one = (o: { index: number; lat: number[]; lon: number[] }) => ({ index: o.index, lat: o.lat[0], lon: o.lon[0] });
    const r = analyseRoute(s, H, th, { usableFix: t.usableFix, home: t.home, start: one(at([0, 4])) });
    expect(r.reached).toEqual(["Home", "East"]);
    expect(r.missed).toEqual([]);
    // 5.5 m away (beyond 2 + 3 m) it is a real first leg, and passing abeam of Home misses it.
    const far = analyseRoute(s, H, th, { usableFix: t.usableFix, home: t.home, start: one(at([-5.5, 0])) });
    expect(far.missed).toEqual(["Home"]);
  });

  it("misses P1 on the first leg when passed abeam outside its circle", () => {
    // From the launch point past P1 about 3 m to its right (east), then on to P2.
    const p = walk([[0, 0], [3, 60], [60, 60], [60, 0], [0, 0]], 3, 10);
    const s = makeSeries(p.e.length, { ...toLatLon(p.e, p.n), armed: () => 1 });
    const t = analyseTrack(s, th);
    const r = analyseRoute(s, P, th, { usableFix: t.usableFix, home: t.home, start: { index: 0, lat: s.lat[0], lon: s.lon[0] } });
    expect(r.missed).toEqual(["P1"]);
    expect(r.reached).toEqual(["P2", "P3", "P4"]);
    const miss = r.events.find((e) => e.kind === "waypoint-missed")!;
    // Closest approach to P1 on that path, in the plane: |cross-track| of P1 from the straight piece.
    const ref = Math.abs(crossTrack([0, 60], [0, 0], [3, 60]).xteM);
    expect(miss.peak).toBeCloseTo(ref, 1);
  });

  it("suspends following while the mission is off, so a manual detour is not off-route", () => {
    // Out 20 m south of the P1→P2 line in MANUAL, back to the line, then AUTO again.
    const base = walk([[0, 0], [0, 60], [30, 60]], 3, 10);
    const out = walk([[30, 60], [30, 40], [30, 60]], 3, 10);
    const rest = walk([[30, 60], [60, 60], [60, 0], [0, 0]], 3, 10);
    const e = [...base.e, ...out.e, ...rest.e];
    const n = [...base.n, ...out.n, ...rest.n];
    const manual = (i: number) => (i >= base.e.length && i < base.e.length + out.e.length ? 0 : 1);
    const s = makeSeries(e.length, { ...toLatLon(e, n), armed: () => 1, modeIndex: manual }, { modeNames: ["MANUAL", "AUTO"] });
    const t = analyseTrack(s, th);
    const m = findMissionStart(s, undefined, { homeIndex: t.home!.index, usableFix: t.usableFix, distanceFromHomeM: t.distanceFromHomeM });
    const suspended = Uint8Array.from({ length: s.n }, (_, i) => (m.engaged![i] ? 0 : 1));
    const start = { index: m.index, lat: s.lat[m.index], lon: s.lon[m.index] };
    const r = analyseRoute(s, P, th, { usableFix: t.usableFix, home: t.home, start, suspended });
    expect(r.events.filter((e) => e.kind === "off-route")).toEqual([]);
    expect(r.reached).toEqual(["P1", "P2", "P3", "P4"]);
    // Without the suspension the detour is one off-route.
    const r2 = analyseRoute(s, P, th, { usableFix: t.usableFix, home: t.home, start });
    expect(r2.events.filter((e) => e.kind === "off-route")).toHaveLength(1);
  });
});
