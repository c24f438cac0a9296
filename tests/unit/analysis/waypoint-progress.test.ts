import { describe, expect, it } from "vitest";
import { followWaypoints } from "@/lib/analysis/waypoint-progress";
import { makeSeries } from "@/tests/helpers/series";
import { offset, toLatLon, walk } from "./geo-path";

// Synthetic drives written for these tests (our own data), 10 Hz, metres east/north of an invented origin.
const wp = (name: string, e: number, n: number) => ({ name, ...offset(e, n) });
const drive = (pts: [number, number][]) => {
  const p = walk(pts, 3, 10);
  return makeSeries(p.e.length, toLatLon(p.e, p.n));
};
const ones = (n: number) => new Uint8Array(n).fill(1);

describe("followWaypoints", () => {
  it("advances nothing while skipped (return-to-home) and resumes after", () => {
    const s = drive([[0, 0], [100, 0], [200, 0]]);
    const wps = [wp("A", 0, 0), wp("B", 100, 0), wp("C", 200, 0)];
    const skip = new Uint8Array(s.n).map((_, i) => (i >= 300 && i < 400 ? 1 : 0)); // 30–40 s: across B
    const r = followWaypoints(s, wps, [2, 2, 2], ones(s.n), skip);
    expect(r.reached).toEqual(["A", "C"]);
    expect(r.missed).toEqual(["B"]); // judged on the first fix after the skip, already past abeam
    expect(r.activeLeg[350]).toBe(-1);
  });

  it("reaches a one-waypoint plan when inside its radius and never misses it", () => {
    const s = drive([[-10, 0], [10, 0]]);
    expect(followWaypoints(s, [wp("Only", 0, 0)], [2], ones(s.n), new Uint8Array(s.n))).toMatchObject({ reached: ["Only"], missed: [], next: 1 });
    expect(followWaypoints(s, [wp("Far", 0, 50)], [2], ones(s.n), new Uint8Array(s.n))).toMatchObject({ reached: [], missed: [], next: 0 });
  });

  it("reaches a repeated waypoint (a zero-length leg) on the same pass", () => {
    const s = drive([[0, 0], [100, 0], [100, 100]]);
    const r = followWaypoints(s, [wp("A", 0, 0), wp("B", 100, 0), wp("B again", 100, 0), wp("C", 100, 100)], [2, 2, 2, 2], ones(s.n), new Uint8Array(s.n));
    expect(r.reached).toEqual(["A", "B", "B again", "C"]);
    expect(r.legLengthM[1]).toBe(0);
  });

  it("ignores samples without a usable fix", () => {
    const s = drive([[0, 0], [100, 0]]);
    const r = followWaypoints(s, [wp("A", 0, 0), wp("B", 100, 0)], [2, 2], new Uint8Array(s.n), new Uint8Array(s.n));
    expect(r).toMatchObject({ reached: [], missed: [], next: 0, events: [] });
  });
});
