import { describe, expect, it } from "vitest";
import { MAX_EXCURSION_S, RETURN_SHARE, trackSteps } from "@/lib/analysis/position-jumps";
import { offset } from "./geo-path";

// Synthetic fixes written for these tests (our own data): 1 Hz, 10 m/s northwards along a meridian.
function line(n: number, shift: (i: number) => number = () => 0, speed = 10) {
  const pts = Array.from({ length: n }, (_, i) => offset(shift(i), i * speed));
  return {
    tS: Array.from({ length: n }, (_, i) => i),
    lat: pts.map((p) => p.lat),
    lon: pts.map((p) => p.lon),
    seg: Array.from({ length: n }, (_, i) => (i === 0 ? 1 : 0)),
    good: Array(n).fill(1),
  };
}
const steps = (l: ReturnType<typeof line>, jump = 30) => trackSteps(l.tS, l.lat, l.lon, l.seg, l.good, jump);
const total = (a: Float64Array) => a.reduce((s, v) => (Number.isFinite(v) ? s + v : s), 0);

describe("trackSteps", () => {
  it("credits every plausible step and finds no jump", () => {
    const r = steps(line(20));
    expect(r.jumps).toEqual([]);
    expect(total(r.stepM)).toBeCloseTo(190, 3);
    expect(Number.isNaN(r.stepM[0])).toBe(true);
  });

  it("treats a one-fix 200 m spike as one returned jump and credits the straight step over it", () => {
    const r = steps(line(20, (i) => (i === 10 ? 200 : 0)));
    expect(r.jumps).toMatchObject([{ fromIndex: 9, toIndex: 10, endIndex: 11, returned: true }]);
    expect(r.jumps[0].jumpM).toBeCloseTo(Math.hypot(200, 10), 1);
    expect(r.outlier[10]).toBe(1);
    expect(total(r.stepM)).toBeCloseTo(190, 3);
  });

  it("takes a three-fix excursion as one jump with three outliers", () => {
    const r = steps(line(20, (i) => (i >= 10 && i < 13 ? 200 : 0)));
    expect(r.jumps).toMatchObject([{ fromIndex: 9, toIndex: 10, endIndex: 13, returned: true }]);
    expect(Array.from(r.outlier.subarray(9, 14))).toEqual([0, 1, 1, 1, 0]);
    expect(total(r.stepM)).toBeCloseTo(190, 3);
  });

  it(`takes an offset that does not come back within ${MAX_EXCURSION_S} s as a lasting jump`, () => {
    const r = steps(line(30, (i) => (i >= 10 ? 200 : 0)));
    expect(r.jumps).toMatchObject([{ fromIndex: 9, toIndex: 10, endIndex: 10, returned: false }]);
    expect(Array.from(r.outlier).every((v) => v === 0)).toBe(true);
    expect(total(r.stepM)).toBeCloseTo(280, 3); // every step but the jump
  });

  it("does not flag a step at the jump speed, and merges jumps that never come back into one event", () => {
    expect(steps(line(5), 10 + 1e-9).jumps).toEqual([]);
    // Below 10 m/s every step is a jump; none returns to fix 0, so they form one lasting event.
    expect(steps(line(5), 9.99).jumps).toMatchObject([{ fromIndex: 0, toIndex: 1, endIndex: 4, returned: false }]);
  });

  it("never steps across a segment start and skips fixes whose time does not advance", () => {
    const l = line(10);
    l.seg[5] = 1;
    l.tS[8] = 7;
    const r = steps(l);
    expect(Number.isNaN(r.stepM[5])).toBe(true);
    expect(Number.isNaN(r.stepM[8])).toBe(true);
    expect(r.untimedFixes).toBe(1);
    expect(r.stepM[9]).toBeCloseTo(20, 3); // from fix 7 to fix 9 in 2 s
  });

  it("never steps across a pause longer than the run gap: the recording resumed, it did not travel", () => {
    const l = line(10);
    for (let i = 5; i < 10; i++) l.tS[i] += 3600; // an hour's pause before fix 5, no move
    const r = trackSteps(l.tS, l.lat, l.lon, l.seg, l.good, 30, 1800);
    expect(Number.isNaN(r.stepM[5])).toBe(true);
    expect(r.jumps).toEqual([]);
    expect(total(r.stepM)).toBeCloseTo(80, 3); // 4 steps before, 4 after
  });

  it(`is back from a jump only when nearer the last good fix than \${RETURN_SHARE} of the jump: a fast run along is not an excursion`, () => {
    // 10 m/s northwards; fix 10 leaps 100 m ahead, fix 11 comes 40 m back: 60 m from fix 9 after 2 s
    // is within 30 m/s of it, but not nearer than half the 100 m leap — the track did not come back.
    const l = line(20);
    const at = (y: number) => offset(0, y);
    [l.lat[10], l.lon[10]] = [at(190).lat, at(190).lon];
    [l.lat[11], l.lon[11]] = [at(150).lat, at(150).lon];
    const r = steps(l);
    expect(r.jumps.length).toBeGreaterThan(0);
    expect(r.jumps.every((j) => !j.returned)).toBe(true);
    expect(Array.from(r.outlier).every((v) => v === 0)).toBe(true);
  });

  it("credits an untimed track's long steps (sparse points) but still drops an out-and-back spike", () => {
    // Numbered one second apart with no clock: a 300 m step is a sparse point, not a teleport.
    const sparse = line(10, () => 0, 10);
    for (let i = 5; i < 10; i++) sparse.lat[i] += 0.0027; // fixes 5… all 300 m further north
    const untimed = trackSteps(sparse.tS, sparse.lat, sparse.lon, sparse.seg, sparse.good, 30, Infinity, false);
    expect(untimed.jumps).toEqual([]);
    expect(total(untimed.stepM)).toBeGreaterThan(90 + 300 - 1);
    const spike = line(20, (i) => (i === 10 ? 200 : 0));
    const r = trackSteps(spike.tS, spike.lat, spike.lon, spike.seg, spike.good, 30, Infinity, false);
    expect(r.jumps).toMatchObject([{ toIndex: 10, returned: true }]);
    expect(total(r.stepM)).toBeCloseTo(190, 3);
  });

  it("throws on a jump speed that is not positive", () => {
    expect(() => steps(line(3), 0)).toThrow(RangeError);
  });
});
