import { describe, expect, it } from "vitest";
import { jumpBound, LOGGED_P99_FACTOR, MIN_PACE_STEPS, STEP_MEDIAN_FACTOR } from "@/lib/analysis/jump-bound";
import { offset } from "./geo-path";

// Synthetic fixes written for these tests (our own data): 1 Hz along a meridian at `speed` m/s.
function line(n: number, speed: number) {
  const pts = Array.from({ length: n }, (_, i) => offset(0, i * speed));
  return {
    tS: Array.from({ length: n }, (_, i) => i),
    lat: pts.map((p) => p.lat),
    lon: pts.map((p) => p.lon),
    seg: new Uint8Array(n),
    good: new Uint8Array(n).fill(1),
    speed: new Float64Array(n).fill(NaN),
  };
}
const bound = (l: ReturnType<typeof line>, vehicle = 30) => jumpBound(l.tS, l.lat, l.lon, l.seg, l.good, l.speed, vehicle, 1800);

describe("jumpBound", () => {
  it("keeps the vehicle type's bound for a slow log", () => {
    expect(bound(line(100, 5))).toEqual({ mps: 30, from: "vehicle" });
  });

  it(`rises to ${STEP_MEDIAN_FACTOR} × the median moving step for a log faster than its type (a car at 33 m/s logged as "ground")`, () => {
    const b = bound(line(100, 33));
    expect(b.from).toBe("log-steps");
    expect(Math.abs(b.mps / (STEP_MEDIAN_FACTOR * 33) - 1)).toBeLessThan(0.001); // plane steps: within 0.1 %
  });

  it(`rises to ${LOGGED_P99_FACTOR} × the 99th percentile of the logged ground speed when that is higher`, () => {
    const l = line(100, 5);
    l.speed.fill(40);
    expect(bound(l)).toEqual({ mps: LOGGED_P99_FACTOR * 40, from: "log-speed" });
  });

  it(`ignores the log's pace below ${MIN_PACE_STEPS} moving steps, parked noise, and steps across a segment start`, () => {
    expect(bound(line(MIN_PACE_STEPS, 50)).from).toBe("vehicle"); // 19 steps
    const parked = line(100, 0.1);
    expect(bound(parked).from).toBe("vehicle");
    const split = line(40, 5);
    split.seg[20] = 1;
    for (let i = 20; i < 40; i++) split.lat[i] += 1; // 111 km away after the segment start
    expect(bound(split).mps).toBe(30);
  });
});
