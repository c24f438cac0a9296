import { quantile } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { analyseRoute } from "@/lib/analysis/route";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { analyseTrack } from "@/lib/analysis/track";
import type { RoutePlanInput } from "@/lib/analysis/types";
import { frozenCopy, makeSeries } from "@/tests/helpers/series";
import { offset, toLatLon, walk } from "./geo-path";

// Every route and run here is synthetic, invented for these tests (our own data), on a field at
// 47.4° N; positions in metres east/north of its origin, 10 Hz (sample i at i/10 s).
const th = defaultThresholds("ground"); // radius 2 m, corridor 3 m, off-route after 2 s, jumps above 30 m/s

const plan = (pts: [string, number, number][], corridorM?: number): RoutePlanInput => ({
  waypoints: pts.map(([name, e, n]) => ({ name, ...offset(e, n) })),
  ...(corridorM !== undefined ? { corridorM } : {}),
});
const run = (e: number[], n: number[]) => makeSeries(e.length, { ...toLatLon(e, n), sats: () => 10, fixType: () => 3 });
const kinds = (r: ReturnType<typeof analyseRoute>) => r.events.map((e) => [e.kind, e.detail.waypoint ?? null]);
const LOOP = plan([["Start", 0, 0], ["Gate", 100, 0], ["Tower", 100, 100], ["Shed", 0, 100], ["Finish", 0, 0]]);

describe("analyseRoute", () => {
  it("reaches every waypoint of a loop driven through them, with no other event", () => {
    const p = walk([[0, 0], [100, 0], [100, 100], [0, 100], [0, 0]], 3, 10); // 0.3 m per sample
    const r = analyseRoute(run(p.e, p.n), LOOP, th);
    expect(r.reached).toEqual(["Start", "Gate", "Tower", "Shed", "Finish"]);
    expect(r.missed).toEqual([]);
    expect(r.notReached).toEqual([]);
    expect(kinds(r)).toEqual([["waypoint-reached", "Start"], ["waypoint-reached", "Gate"], ["waypoint-reached", "Tower"], ["waypoint-reached", "Shed"], ["waypoint-reached", "Finish"]]);
    const gate = r.events[1];
    expect(gate.startS).toBe(32.7); // first sample inside 2 m: 98.1 m along (97.8 m at 32.6 s is outside)
    expect(gate.peak).toBeCloseTo(0.1, 2); // closest: 99.9 m along at 33.3 s
    expect(gate.detail.closestS).toBe(33.3);
    expect(gate.endS).toBeGreaterThanOrEqual(34);
    expect(gate.endS).toBeLessThanOrEqual(34.1);
    expect(gate.threshold).toBe(2);
    // The next leg starts at the radius, so its first samples (still on the old leg) are up to 2 m off it.
    for (const leg of r.legs) expect(leg.p95XteM!).toBeLessThan(0.02);
    for (const leg of r.legs) expect(leg.maxXteM!).toBeLessThanOrEqual(2);
    expect(r.legs.map((l) => l.lengthM)).toEqual([100, 100, 100, 100].map((v) => expect.closeTo(v, 2)));
  });

  it("misses a waypoint passed abeam 2.5 m off (radius 2 m) at the moment it is abeam, and nothing else", () => {
    // Start at A, drift 2.5 m left by 20 m, pass B at 2.5 m, then drive to C exactly.
    const pl = plan([["A", 0, 0], ["B", 100, 0], ["C", 200, 20]]);
    const p = walk([[0, 0], [20, 2.5], [100, 2.5], [200, 20]], 3, 10);
    const r = analyseRoute(run(p.e, p.n), pl, th);
    expect(r.reached).toEqual(["A", "C"]);
    expect(r.missed).toEqual(["B"]);
    expect(kinds(r)).toEqual([["waypoint-reached", "A"], ["waypoint-missed", "B"], ["waypoint-reached", "C"]]);
    const miss = r.events[1];
    expect(miss.startS).toBe(33.4); // first sample past 100.156 m along the path, i.e. east of B
    expect(miss.peak).toBeCloseTo(2.5, 1);
    expect(miss.detail.how).toBe("abeam");
    const mid = p.e.findIndex((x) => x >= 60);
    expect(r.xteM[mid]).toBeCloseTo(-2.5, 2); // north of an eastbound leg = left = negative
    expect(r.atdM[mid]).toBeCloseTo(p.e[mid], 2);
  });

  it("misses a waypoint whose corner is cut, and still follows the rest of the route", () => {
    const p = walk([[0, 0], [90, 0], [100, 10], [100, 100], [0, 100], [0, 0]], 3, 10);
    const r = analyseRoute(run(p.e, p.n), LOOP, th);
    expect(r.missed).toEqual(["Gate"]);
    expect(r.reached).toEqual(["Start", "Tower", "Shed", "Finish"]);
    const miss = r.events.find((e) => e.kind === "waypoint-missed")!;
    expect(miss.detail.how).toBe("corner");
    expect(miss.peak).toBeCloseTo(Math.SQRT1_2 * 10, 1);
  });

  it("fires off-route once for 3.2 s beyond the 3 m corridor (until back inside 2.5 m), not for a 1.4 s excursion", () => {
    // 4 m/s east along A→B; 6.5 m right from 11 s to 13 s (ramps of 1 s), 5 m right around 25–26 s.
    const y = (t: number) =>
      t >= 10 && t <= 14 ? -6.5 * Math.min(1, t - 10, 14 - t) : t >= 24.75 && t <= 26.75 ? -5 * Math.min(1, (t - 24.75) / 0.5, (26.75 - t) / 0.5) : 0;
    const t = Array.from({ length: 503 }, (_, i) => i / 10);
    const r = analyseRoute(run(t.map((s) => 4 * s), t.map(y)), plan([["A", 0, 0], ["B", 201, 0]]), th);
    expect(kinds(r)).toEqual([["waypoint-reached", "A"], ["off-route", null], ["waypoint-reached", "B"]]);
    const off = r.events[1];
    // Enters above 3 m at 10.5 s; leaves below 3 − 0.5 m (hysteresis), 6.5·(14 − t) < 2.5 → t > 13.62 → 13.7 s.
    expect(off).toMatchObject({ startS: 10.5, endS: 13.7, threshold: 3 });
    expect(off.peak).toBeCloseTo(6.5, 2);
    expect(off.detail).toMatchObject({ side: "right", legIndex: 0, from: "A", to: "B", unit: "m", exitBelowM: 2.5 });
    expect(off.detail.durationS).toBeCloseTo(3.2, 9);
    const leg = r.legs[0];
    const abs = Array.from(r.xteM).filter(Number.isFinite).map(Math.abs);
    expect(leg.maxXteM).toBeCloseTo(6.5, 2);
    expect(leg.p95XteM).toBe(quantile(abs, 0.95)); // identity with simple-statistics on the same values
    expect(leg.rmsXteM).toBeCloseTo(Math.sqrt(abs.reduce((s, v) => s + v * v, 0) / abs.length), 9);
  });

  it("leaves XTE NaN where there is no fix", () => {
    const p = walk([[0, 0], [100, 0]], 3, 10);
    const s = run(p.e, p.n);
    for (let i = 100; i < 130; i++) (s.lat as Float64Array)[i] = NaN;
    const r = analyseRoute(s, plan([["A", 0, 0], ["B", 100, 0]]), th);
    expect(Number.isNaN(r.xteM[110])).toBe(true);
    expect(r.activeLeg[110]).toBe(-1);
    expect(Number.isFinite(r.xteM[140])).toBe(true);
  });

  it("measures return-to-home against the straight line home instead of the route", () => {
    // Out 100 m along A→B, then RTH from 33.4 s: back home bowing 4 m to the side.
    const out = walk([[0, 0], [100, 0]], 3, 10);
    const back = walk([[100, 0], [50, 4], [0, 0]], 3, 10);
    const e = [...out.e, ...back.e.slice(1)];
    const n = [...out.n, ...back.n.slice(1)];
    const rthStart = out.e.length / 10;
    const s = run(e, n);
    const r = analyseRoute(s, plan([["A", 0, 0], ["B", 200, 0], ["C", 200, 200]]), th, { rthSpans: [{ startS: rthStart, endS: 1e9 }] });
    expect(r.events.map((x) => x.kind)).toEqual(["waypoint-reached"]); // no off-route although 4 m > 3 m
    expect(r.notReached).toEqual(["B", "C"]);
    expect(r.rth).toHaveLength(1);
    expect(r.rth[0].maxDeviationM).toBeCloseTo(4, 1);
    expect(r.rth[0].rmsDeviationM).toBeCloseTo(4 / Math.sqrt(3), 1); // a triangle profile
    const k = out.e.length + 100;
    expect(Number.isNaN(r.xteM[k])).toBe(true);
    expect(r.rthDeviationM[k]).toBeGreaterThan(0);
    expect(Number.isNaN(r.rthDeviationM[10])).toBe(true);
  });

  it("ignores a position-jump outlier when given the track's usable fixes", () => {
    // A 200 m spike ahead at 20 m would cross the abeam lines of B, C and D.
    const p = walk([[0, 0], [200, 0]], 3, 10);
    const i = p.e.findIndex((x) => x >= 20);
    p.e[i] += 200;
    const s = run(p.e, p.n);
    const pl = plan([["A", 0, 0], ["B", 100, 0], ["C", 150, 0], ["D", 200, 0]]);
    expect(analyseRoute(s, pl, th).missed).toEqual(["B", "C", "D"]);
    const track = analyseTrack(s, th);
    const r = analyseRoute(s, pl, th, { usableFix: track.usableFix, distanceFromHome: track.distanceFromHomeM });
    expect(r.missed).toEqual([]);
    expect(r.reached).toEqual(["A", "B", "C", "D"]);
    expect(r.events[1].distanceFromHomeM).toBeCloseTo(100, 0); // B's event carries the track's distance from home
  });

  it("handles an empty log, one sample, and an empty plan", () => {
    const empty = analyseRoute(makeSeries(0), LOOP, th);
    expect(empty).toMatchObject({ reached: [], missed: [], notReached: ["Start", "Gate", "Tower", "Shed", "Finish"], events: [] });
    expect(empty.xteM).toHaveLength(0);
    const one = analyseRoute(run([0], [0]), LOOP, th);
    expect(one.reached).toEqual(["Start"]);
    expect(one.events).toMatchObject([{ kind: "waypoint-reached", startS: 0, endS: 0, peak: 0 }]);
    const none = analyseRoute(run([0, 1], [0, 0]), { waypoints: [] }, th);
    expect(none).toMatchObject({ legs: [], reached: [], missed: [], notReached: [], events: [] });
  });

  it("does not mutate its inputs (frozen copies give the same result)", () => {
    const p = walk([[0, 0], [100, 0], [100, 100]], 3, 10);
    const s = run(p.e, p.n);
    const r = analyseRoute(s, LOOP, th);
    const frozenPlan = Object.freeze({ ...LOOP, waypoints: Object.freeze(LOOP.waypoints.map((w) => Object.freeze({ ...w }))) }) as RoutePlanInput;
    expect(analyseRoute(frozenCopy(s), frozenPlan, Object.freeze({ ...th }))).toEqual(r);
  });

  it("throws on a waypoint that is not a position, a radius or corridor ≤ 0, or a mismatched distance array", () => {
    const s = run([0], [0]);
    expect(() => analyseRoute(s, { waypoints: [{ name: "X", lat: NaN, lon: 0 }] }, th)).toThrow(RangeError);
    expect(() => analyseRoute(s, { waypoints: [{ name: "X", lat: 1, lon: 1, radiusM: 0 }] }, th)).toThrow(RangeError);
    expect(() => analyseRoute(s, { ...LOOP, corridorM: 0 }, th)).toThrow(RangeError);
    expect(() => analyseRoute(s, LOOP, th, { distanceFromHome: new Float64Array(2) })).toThrow(RangeError);
  });
});
