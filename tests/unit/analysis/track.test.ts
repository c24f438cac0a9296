import { describe, expect, it } from "vitest";
import { geodesicDistance } from "@/lib/analysis/geodesy";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import { analyseTrack, STALE_MAX_SHARE, staleLead } from "@/lib/analysis/track";
import { frozenCopy, makeSeries } from "@/tests/helpers/series";
import { offset, toLatLon, walk } from "./geo-path";

// Every track here is synthetic, built for these tests (our own data): an L-shaped drive at 5 m/s,
// 10 Hz (sample i at i/10 s), 150 m east then 150 m north of an invented field; 601 samples, 60 s.
const th = defaultThresholds("ground"); // 5 satellites, HDOP 2.5, jumps above 30 m/s
const path = walk([[0, 0], [150, 0], [150, 150]], 5, 10);
const N = path.e.length;

/** The L-drive with good GPS, then `edit` applied to its columns. */
function drive(edit: (c: { lat: number[]; lon: number[]; sats: number[]; fixType: number[]; hdop: number[] }) => void = () => {}, extra = {}) {
  const { lat, lon } = toLatLon(path.e, path.n);
  const c = { lat, lon, sats: Array(N).fill(10), fixType: Array(N).fill(3), hdop: Array(N).fill(0.9) };
  edit(c);
  return makeSeries(N, { ...c, ...extra });
}

/** Σ geodesic over consecutive usable fixes, skipping jump steps: the reference for distance travelled. */
function geodesicSum(lat: ArrayLike<number>, lon: ArrayLike<number>, usable: Uint8Array): number {
  let sum = 0;
  let prev = -1;
  for (let i = 0; i < usable.length; i++) {
    if (!usable[i]) continue;
    if (prev >= 0) sum += geodesicDistance(lat[prev], lon[prev], lat[i], lon[i]);
    prev = i;
  }
  return sum;
}

describe("analyseTrack", () => {
  it("measures a clean drive: home, 300 m travelled, 212 m farthest, 5 m/s, no events", () => {
    const s = drive();
    const r = analyseTrack(s, th);
    expect(r.home).toEqual({ index: 0, tS: 0, lat: s.lat[0], lon: s.lon[0] });
    expect(r.distanceM).toBeCloseTo(300, 1);
    expect(r.maxDistanceFromHomeM).toBeCloseTo(Math.hypot(150, 150), 1);
    expect(r.farthest?.index).toBe(N - 1);
    expect(r.speedSource).toBe("steps");
    expect(r.maxSpeedMps).toBeCloseTo(5, 2);
    expect(r.meanSpeedMps).toBeCloseTo(5, 2);
    expect(r.events).toEqual([]);
    expect(r.usableFixes).toBe(N);
    expect(r.hdopWarnS).toBe(0);
    expect(r.maxHdop).toBe(0.9);
  });

  it("sums plane steps to within 0.1 % of GeographicLib on the same fixes (a 30 km fixed-wing leg too)", () => {
    const short = drive();
    const r = analyseTrack(short, th);
    expect(Math.abs(r.distanceM - geodesicSum(short.lat, short.lon, r.usableFix)) / r.distanceM).toBeLessThan(1e-3);
    // 30 m/s at 1 Hz, 20 km east then 10 km north: the plane is re-anchored every km.
    const far = walk([[0, 0], [20_000, 0], [20_000, 10_000]], 30, 1);
    const ll = toLatLon(far.e, far.n);
    const plane = makeSeries(far.e.length, { ...ll, sats: () => 12 }, { hz: 1 });
    const rf = analyseTrack(plane, defaultThresholds("fixed-wing"));
    expect(Math.abs(rf.distanceM - geodesicSum(ll.lat, ll.lon, rf.usableFix)) / rf.distanceM).toBeLessThan(1e-3);
    expect(Math.abs(rf.distanceM - 30_000)).toBeLessThan(30); // nominal length of the polar-placed path
    for (let i = 0; i < far.e.length; i += 37) {
      const g = geodesicDistance(ll.lat[0], ll.lon[0], ll.lat[i], ll.lon[i]);
      expect(Math.abs(rf.distanceFromHomeM[i] - g), `sample ${i}`).toBeLessThanOrEqual(Math.max(1e-3 * g, 1e-6));
    }
    expect(rf.maxDistanceFromHomeM).toBeCloseTo(geodesicDistance(ll.lat[0], ll.lon[0], ll.lat.at(-1)!, ll.lon.at(-1)!), 6);
  });

  it("reports a 3 s GPS dropout as one fix-lost event from 5.0 s to 8.0 s at the last good fix", () => {
    const s = drive((c) => {
      for (let i = 50; i < 80; i++) c.lat[i] = c.lon[i] = NaN;
    });
    const r = analyseTrack(s, th);
    expect(r.events).toHaveLength(1);
    const e = r.events[0];
    expect(e).toMatchObject({ kind: "fix-lost", startS: 5, endS: 8, lat: s.lat[49], lon: s.lon[49], peak: 10, threshold: 5 }); // peak: fewest satellites logged
    expect(e.distanceFromHomeM).toBeCloseTo(24.5, 3);
    expect(e.detail).toMatchObject({ durationS: 3, causes: ["no-position"] });
    expect(r.fixLostS).toBe(3);
    expect(Number.isNaN(r.distanceFromHomeM[60])).toBe(true);
    expect(r.distanceM).toBeCloseTo(300, 1); // the 4.9 s → 8.0 s step is plausible and bridges the gap
  });

  it("counts too few satellites, fix type 0 and position 0,0 as lost, each where it happens and nowhere else", () => {
    const s = drive((c) => {
      for (let i = 300; i < 305; i++) c.sats[i] = 3;
      c.fixType[400] = 0;
      c.lat[500] = c.lon[500] = 0;
    });
    const r = analyseTrack(s, th);
    expect(r.events.map((e) => [e.kind, e.startS, e.endS])).toEqual([
      ["fix-lost", 30, 30.5],
      ["fix-lost", 40, 40.1],
      ["fix-lost", 50, 50.1],
    ]);
    expect(r.events[0]).toMatchObject({ peak: 3, detail: { causes: ["few-satellites"], unit: "satellites" } });
    expect(r.events[1].detail.causes).toEqual(["fix-type-0"]);
    expect(r.events[2].detail.causes).toEqual(["zero-position"]);
    expect(r.events[2].lat).toBe(s.lat[499]);
  });

  it("does not call the fix lost before it was first acquired; home is the first good fix", () => {
    const s = drive((c) => {
      for (let i = 0; i < 20; i++) c.sats[i] = 2;
    });
    const r = analyseTrack(s, th);
    expect(r.home?.index).toBe(20);
    expect(r.events).toEqual([]);
  });

  it("does not lose the fix between the GPS rows of a mixed-rate log (GPS on every 5th row)", () => {
    const s = drive((c) => {
      for (let i = 0; i < N; i++) if (i % 5) c.lat[i] = c.lon[i] = c.sats[i] = c.fixType[i] = c.hdop[i] = NaN;
    });
    const r = analyseTrack(s, th);
    expect(r.events).toEqual([]);
    expect(r.distanceM).toBeCloseTo(300, 1);
  });

  it("flags a 200 m position jump at 50.0 s, excludes it from distance and farthest point", () => {
    const jumped = offset(path.e[500], path.n[500] + 200);
    const s = drive((c) => {
      c.lat[500] = jumped.lat;
      c.lon[500] = jumped.lon;
    });
    const r = analyseTrack(s, th);
    expect(r.events).toHaveLength(1);
    const e = r.events[0];
    expect(e).toMatchObject({ kind: "position-jump", startS: 50, endS: 50.1, lat: s.lat[499], lon: s.lon[499], threshold: 30 });
    expect(e.peak).toBeCloseTo(geodesicDistance(s.lat[499], s.lon[499], jumped.lat, jumped.lon) / 0.1, 6);
    expect(e.detail).toMatchObject({ unit: "m/s", returned: true });
    expect(e.detail.jumpM as number).toBeCloseTo(200.25, 0);
    expect(r.usableFix[500]).toBe(0);
    expect(Number.isNaN(r.distanceFromHomeM[500])).toBe(true);
    expect(r.distanceM).toBeCloseTo(300, 1);
    expect(r.maxDistanceFromHomeM).toBeCloseTo(Math.hypot(150, 150), 1);
  });

  it("never bridges a segment start", () => {
    // Two 20 s segments; between them the vehicle drove 100 m unseen (t jumps from 19.9 s to 40 s).
    const a = walk([[0, 0], [100, 0]], 5, 10);
    const b = walk([[200, 0], [300, 0]], 5, 10);
    const ll = toLatLon([...a.e, ...b.e], [...a.n, ...b.n]);
    const n = ll.lat.length;
    const s = makeSeries(n, { ...ll, tS: (i) => (i < a.e.length ? i / 10 : 40 + (i - a.e.length) / 10), segmentStart: (i) => (i === 0 || i === a.e.length ? 1 : 0) });
    const r = analyseTrack(s, th);
    expect(r.distanceM).toBeCloseTo(200, 1);
    expect(r.events).toEqual([]);
  });

  it("times HDOP above 2.5 (held until the next sample) and reports the worst", () => {
    const s = drive((c) => {
      for (let i = 100; i < 120; i++) c.hdop[i] = 3.2;
    });
    const r = analyseTrack(s, th);
    expect(r.hdopWarnS).toBeCloseTo(2, 9);
    expect(r.maxHdop).toBe(3.2);
    expect(r.events).toEqual([]);
  });

  it("takes speed from the log when it carries ground speed", () => {
    const s = drive(() => {}, { speedMps: (i: number) => (i === 300 ? 7.5 : 5) });
    const r = analyseTrack(s, th);
    expect(r.speedSource).toBe("log");
    expect(r.maxSpeedMps).toBe(7.5);
    expect(r.meanSpeedMps).toBeCloseTo(5 + 2.5 / N, 9);
  });

  it("returns an empty result for an empty log and for a log without any fix", () => {
    for (const s of [makeSeries(0), makeSeries(5)]) {
      const r = analyseTrack(s, th);
      expect(r).toMatchObject({ home: null, distanceM: 0, maxDistanceFromHomeM: null, maxSpeedMps: null, meanSpeedMps: null, speedSource: null, events: [] });
      expect(r.distanceFromHomeM).toHaveLength(s.n);
    }
  });

  it("handles one sample: home there, nothing travelled", () => {
    const r = analyseTrack(makeSeries(1, { lat: [47.4], lon: [8.5] }), th);
    expect(r).toMatchObject({ home: { index: 0, lat: 47.4, lon: 8.5 }, distanceM: 0, maxDistanceFromHomeM: 0, speedSource: null, events: [] });
    expect(Array.from(r.distanceFromHomeM)).toEqual([0]);
  });

  it("does not mutate its input (frozen copy gives the same result)", () => {
    const s = drive((c) => {
      for (let i = 50; i < 80; i++) c.lat[i] = c.lon[i] = NaN;
    });
    const before = JSON.stringify(Array.from(s.lat));
    const r = analyseTrack(s, th);
    expect(analyseTrack(frozenCopy(s), th)).toEqual(r);
    expect(JSON.stringify(Array.from(s.lat))).toBe(before);
  });
});

describe("staleLead: a receiver's stored position from an earlier session", () => {
  // Three fixes 12,000 km away, two years before the run (as a real logger's file does): set aside.
  const lead = 3;
  const far = { lat: 25.06, lon: 121.64 };
  function withLead(n = lead, gapS = 2 * 365 * 86_400) {
    const { lat, lon } = toLatLon(path.e, path.n);
    const L = lat.length + n;
    return makeSeries(L, {
      tS: (i) => (i < n ? i : gapS + i / 10),
      lat: (i) => (i < n ? far.lat : lat[i - n]),
      lon: (i) => (i < n ? far.lon : lon[i - n]),
      sats: () => 10,
      fixType: () => 3,
      hdop: () => 0.9,
    });
  }

  it("sets the lead aside: home, distance and farthest are the run's own", () => {
    const s = withLead();
    const r = analyseTrack(s, th);
    expect(r.firstIndex).toBe(lead);
    expect(r.staleFixes).toBe(lead);
    expect(r.home!.index).toBe(lead);
    expect(r.distanceM).toBeCloseTo(300, 1);
    expect(r.maxDistanceFromHomeM).toBeCloseTo(Math.hypot(150, 150), 1);
    expect(r.events.filter((e) => e.kind === "position-jump")).toEqual([]);
  });

  it(`keeps a lead larger than ${STALE_MAX_SHARE * 100} % of the fixes, or one without the long pause`, () => {
    const good = (s: ReturnType<typeof withLead>) => Uint8Array.from({ length: s.n }, () => 1);
    const big = withLead(Math.ceil(N * STALE_MAX_SHARE) + 40);
    expect(staleLead(big.tS, big.lat, big.lon, good(big), th.runSplitGapS)).toBe(0);
    const short = withLead(lead, 600); // ten minutes: within one run
    expect(staleLead(short.tS, short.lat, short.lon, good(short), th.runSplitGapS)).toBe(0);
  });

  it("measures an untimed track by its geometry and gives no speeds", () => {
    const s = drive();
    const r = analyseTrack(s, th, { timesUsable: false });
    expect(r.distanceM).toBeCloseTo(300, 1);
    expect(r.staleFixes).toBe(0);
  });
});
