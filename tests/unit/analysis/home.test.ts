import { describe, expect, it } from "vitest";
import { geodesicDistance } from "@/lib/analysis/geodesy";
import { isGoodHomeFix, placeHome } from "@/lib/analysis/home";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { analyseTrack } from "@/lib/analysis/track";
import { makeSeries } from "@/tests/helpers/series";
import { offset, toLatLon, walk } from "./geo-path";

// Synthetic runs written for these tests (our own data), 10 Hz. DESIGN.md §10 "Home is where the
// vehicle was armed": a good fix is ≥ 6 satellites and HDOP ≤ 2.5 by default (common practice).
const th = defaultThresholds("ground");
const ones = (n: number) => new Uint8Array(n).fill(1);

describe("placeHome", () => {
  it("takes the first good fix at or after arming, not the log's first fix", () => {
    const s = makeSeries(10, { armed: (i) => (i >= 4 ? 1 : 0), sats: () => 9, hdop: () => 0.9 });
    expect(placeHome(s, ones(10), th)).toEqual({ index: 4, source: "arming", armedIndex: 4 });
  });

  it("skips poor fixes after arming (few satellites, high HDOP) until a good one", () => {
    const s = makeSeries(10, { armed: () => 1, sats: (i) => (i < 3 ? 4 : 7), hdop: (i) => (i < 6 ? 8 : 1.2) });
    expect(placeHome(s, ones(10), th)).toMatchObject({ index: 6, source: "arming" });
  });

  it("judges only what is logged: a track without satellites or HDOP counts as good", () => {
    const s = makeSeries(5, {});
    expect(isGoodHomeFix(s, ones(5), 0, th)).toBe(true);
    expect(placeHome(s, ones(5), th)).toEqual({ index: 0, source: "first-good-fix", armedIndex: -1 });
  });

  it("without an armed sample takes the first good fix", () => {
    const s = makeSeries(8, { armed: () => 0, hdop: (i) => (i < 5 ? 12 : 1) });
    expect(placeHome(s, ones(8), th)).toEqual({ index: 5, source: "first-good-fix", armedIndex: -1 });
  });

  it("falls back to the last good fix before arming, then to the first usable fix", () => {
    const before = makeSeries(8, { armed: (i) => (i >= 5 ? 1 : 0), hdop: (i) => (i < 4 ? 1 : 9) });
    expect(placeHome(before, ones(8), th)).toEqual({ index: 3, source: "before-arming", armedIndex: 5 });
    const poor = makeSeries(8, { armed: (i) => (i >= 5 ? 1 : 0), hdop: () => 9 });
    expect(placeHome(poor, ones(8), th)).toEqual({ index: 5, source: "first-fix", armedIndex: 5 });
    expect(placeHome(makeSeries(3, { hdop: () => 9 }), ones(3), th)).toMatchObject({ index: 0, source: "first-fix" });
  });

  it("has no home without a usable fix", () => {
    expect(placeHome(makeSeries(4, { armed: () => 1 }), new Uint8Array(4), th)).toEqual({ index: -1, source: null, armedIndex: 0 });
  });
});

describe("analyseTrack with home at arming", () => {
  // Fix at the car (cold start, HDOP 15 for 5 s), a 70 m walk east at 1.4 m/s to the launch
  // point, armed there, then a drive 100 m north at 3 m/s.
  const walkToLaunch = walk([[0, 0], [70, 0]], 1.4, 10);
  const drive = walk([[70, 0], [70, 100]], 3, 10);
  const e = [...Array(50).fill(0), ...walkToLaunch.e, ...Array(20).fill(70), ...drive.e];
  const nn = [...Array(50).fill(0), ...walkToLaunch.n, ...Array(20).fill(0), ...drive.n];
  const armedFrom = 50 + walkToLaunch.e.length;
  const { lat, lon } = toLatLon(e, nn);
  const wild = offset(2000, 0);
  /** The run, with one fix 2 km away at sample `wildAt` (a receiver's wild fix). */
  const coldStart = (wildAt = -1) =>
    makeSeries(e.length, {
      lat: (i) => (i === wildAt ? wild.lat : lat[i]),
      lon: (i) => (i === wildAt ? wild.lon : lon[i]),
      sats: (i) => (i < 30 ? 4 : 11),
      hdop: (i) => (i < 50 ? 15 : 0.9),
      armed: (i) => (i >= armedFrom ? 1 : 0),
    });
  const s = coldStart();

  it("puts home at the launch point, and measures from there", () => {
    const r = analyseTrack(s, th);
    expect(r.homeSource).toBe("arming");
    expect(r.home?.index).toBe(armedFrom);
    const launch = offset(70, 0);
    // Reference: GeographicLib (Karney 2013, J. Geodesy 87:43–55) between the home fix and the launch point.
    expect(geodesicDistance(r.home!.lat, r.home!.lon, launch.lat, launch.lon)).toBeLessThan(0.01);
    const driven = drive.n[drive.n.length - 1]; // 99.9 m: the last 0.3 m step of the walk
    expect(r.maxDistanceFromHomeM).toBeCloseTo(driven, 1); // not the 122 m from the car
    expect(r.distanceM).toBeCloseTo(driven, 1); // the walk is not the run
    expect(Number.isNaN(r.distanceFromHomeM[10])).toBe(true);
    expect(r.hdopWarnS).toBe(0); // the cold start's HDOP 15 was before home
  });

  it("does not report a cold start's wild fix before home as a position jump", () => {
    const jumps = (wildAt: number) => analyseTrack(coldStart(wildAt), th).events.filter((ev) => ev.kind === "position-jump");
    expect(jumps(35)).toEqual([]); // after the first satellites, before arming
    expect(jumps(armedFrom + 40)).toHaveLength(1); // the same fix on the run is one
  });
});
