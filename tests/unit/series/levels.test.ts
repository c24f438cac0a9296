/**
 * Display levels (lib/series/levels.ts) on synthetic series of our own. Expectations are checked
 * against a brute-force scan of the same arrays; min/max envelopes per bucket are common practice
 * for plotting large series, not a published algorithm we reproduce.
 */
import { describe, expect, it } from "vitest";
import { BASE_BUCKET, buildTrack, findBreaks, LEVEL_CHUNK, pointIndices, POINTS_STORED, TOP_MAX_BUCKETS, TRACK_POINTS } from "@/lib/series/levels";
import { makeSeries } from "../../helpers/series";
import { bruteMinMax, build, level, rand } from "./stored";

describe("level pyramid", () => {
  const n = 200_000;
  const r = rand(1);
  // 10 Hz with jitter, RSSI with holes, LQ only on every third row, a 32-bit float column.
  const series = makeSeries(n, {
    tS: (i) => i / 10 + (i ? r() * 0.01 : 0),
    rssiDbm: () => (r() < 0.1 ? NaN : Math.round((-90 + r() * 50) * 10) / 10),
    lqPct: (i) => (i % 3 ? NaN : Math.round(r() * 100)),
  });
  series.voltageV = Float32Array.from({ length: n }, (_, i) => 16.8 - i / 1e5 + r() * 0.05);

  it("grows buckets ×8 from 16 until a level has at most 1000 buckets", async () => {
    const { meta } = await build(series);
    expect(meta.levels.map((l) => l.size)).toEqual([16, 128, 1024]);
    expect(meta.levels.map((l) => l.count)).toEqual([12500, 1563, 196]);
    expect(meta.levels[meta.levels.length - 1].count).toBeLessThanOrEqual(TOP_MAX_BUCKETS);
    expect(meta.levels[meta.levels.length - 2].count).toBeGreaterThan(TOP_MAX_BUCKETS);
    expect(meta.levels[0].chunkSeq).toEqual([0, LEVEL_CHUNK * BASE_BUCKET]);
  });

  it("keeps each bucket's min and max exactly, in time order, at every level", async () => {
    const { blobs, meta } = await build(series);
    for (const L of meta.levels) {
      const seq = level(blobs, L.size, "_seq");
      for (const f of ["rssiDbm", "lqPct", "voltageV"] as const) {
        const v = level(blobs, L.size, f);
        expect(v.length).toBe(2 * L.count);
        for (let b = 0; b < L.count; b++) {
          const lo = seq[b];
          const hi = b + 1 < L.count ? seq[b + 1] : n;
          const want = bruteMinMax(series[f], lo, hi);
          if (want.iMin < 0) {
            expect(Number.isNaN(v[2 * b]) && Number.isNaN(v[2 * b + 1])).toBe(true);
            continue;
          }
          // Stored as 32-bit floats, like the samples table's FLOAT columns.
          const [a, c] = want.iMin <= want.iMax ? [want.min, want.max] : [want.max, want.min];
          if (v[2 * b] !== Math.fround(a) || v[2 * b + 1] !== Math.fround(c)) {
            throw new Error(`${f} level ${L.size} bucket ${b}: stored ${v[2 * b]}, ${v[2 * b + 1]}; scan ${a}, ${c}`);
          }
        }
      }
    }
  });

  it("covers every sample once, with times non-decreasing", async () => {
    const { blobs, meta } = await build(series);
    for (const L of meta.levels) {
      const seq = level(blobs, L.size, "_seq");
      const tFirst = level(blobs, L.size, "_tFirst");
      const tLast = level(blobs, L.size, "_tLast");
      expect(seq[0]).toBe(0);
      for (let b = 1; b < L.count; b++) {
        expect(seq[b] - seq[b - 1]).toBeGreaterThan(0);
        expect(seq[b] - seq[b - 1]).toBeLessThanOrEqual(L.size);
        expect(tFirst[b]).toBeGreaterThanOrEqual(tLast[b - 1]);
      }
      expect(tLast[L.count - 1]).toBe(series.tS[n - 1]);
    }
    expect(meta.tEnd).toBe(series.tS[n - 1]);
  });

  it("records which fields have values", async () => {
    const { meta } = await build(series, { distanceFromHomeM: new Float64Array(n).fill(NaN) });
    expect(meta.present).toEqual(["rssiDbm", "lqPct", "voltageV"]);
    expect(meta.rawDerived).toEqual([]);
  });
});

describe("breaks", () => {
  // 10 Hz; a segment starts at 1000, a 30 s gap before 5003, time steps back at 7001.
  const n = 10_000;
  const t = (i: number) => i / 10 + (i >= 5003 ? 30 : 0) - (i >= 7001 ? 2 : 0);
  const series = makeSeries(n, { tS: t, segmentStart: (i) => (i === 0 || i === 1000 ? 1 : 0), altM: (i) => i % 17 });

  it("finds segment starts, long steps and time going back", () => {
    const br = findBreaks(series, 0.5);
    expect(Array.from(br.index)).toEqual([1000, 5003, 7001]);
    expect(br.total).toBe(3);
    // Segment start first, then the longer step.
    expect(Array.from(br.rank)).toEqual([0, 1, 2]);
  });

  it("starts a bucket exactly at each break and flags it, at every level that honours it", async () => {
    const { blobs, meta } = await build(series);
    expect(meta.gapStepS).toBeCloseTo(0.5, 9);
    expect(meta.breaks).toBe(3);
    for (const L of meta.levels) {
      const seq = Array.from(level(blobs, L.size, "_seq"));
      const gap = Array.from(level(blobs, L.size, "_gap"));
      const flagged = seq.filter((_, b) => gap[b] === 1);
      expect(flagged).toEqual([1000, 5003, 7001]);
    }
    // Backwards time is clamped by a running maximum: x positions never go back.
    const tFirst = level(blobs, 16, "_tFirst");
    for (let b = 1; b < tFirst.length; b++) expect(tFirst[b]).toBeGreaterThanOrEqual(tFirst[b - 1]);
  });

  it("honours at most one break per two buckets of a level, the most important first", async () => {
    // A segment start every 5 samples: far more than a level can carry.
    const many = makeSeries(4000, { segmentStart: (i) => (i % 5 === 0 ? 1 : 0), altM: (i) => i });
    const { blobs, meta } = await build(many);
    const gaps16 = Array.from(level(blobs, 16, "_gap")).filter(Boolean).length;
    expect(gaps16).toBeLessThanOrEqual(Math.floor(Math.ceil(4000 / 16) / 2));
    expect(meta.breaks).toBe(799);
  });
});

describe("scatter sample", () => {
  it("takes every sample of a short run", () => {
    expect(Array.from(pointIndices(5))).toEqual([0, 1, 2, 3, 4]);
  });

  it("takes one sample per even window, strictly increasing, without locking onto a period", () => {
    const n = 1_000_003;
    const p = pointIndices(n);
    expect(p.length).toBe(POINTS_STORED);
    for (let k = 0; k < p.length; k++) {
      expect(p[k]).toBeGreaterThanOrEqual(Math.floor((k * n) / POINTS_STORED));
      expect(p[k]).toBeLessThan(Math.floor(((k + 1) * n) / POINTS_STORED));
    }
    // A log writing position on every 5th row: a plain stride of 50 would hit all or none of them.
    const share = Array.from(p).filter((i) => i % 5 === 0).length / p.length;
    expect(share).toBeGreaterThan(0.17);
    expect(share).toBeLessThan(0.23);
  });
});

describe("track overview", () => {
  const pos = (i: number) => ({ lat: 53 + i * 1e-6, lon: -3 + i * 1e-6 });

  it("picks the worst-link sample of each bucket", () => {
    const n = 40_000;
    // LQ 100 everywhere except one dip per 1000 samples, at a varying place.
    const dip = (i: number) => i % 1000 === (Math.floor(i / 1000) * 37) % 1000;
    const s = makeSeries(n, { lat: (i) => pos(i).lat, lon: (i) => pos(i).lon, lqPct: (i) => (dip(i) ? 20 + (i % 7) : 100) });
    const tr = buildTrack(s, findBreaks(s, 0.5), 5);
    expect(tr.metric).toBe("lqPct");
    expect(tr.t.length).toBe(TRACK_POINTS);
    // 10 samples per bucket; every dip must be on the track with its own value and position.
    const per = Math.ceil(n / TRACK_POINTS);
    for (let i = 0; i < n; i++) {
      if (!dip(i)) continue;
      const k = Math.floor(i / per);
      expect(tr.link[k]).toBe(20 + (i % 7));
      expect(tr.lat[k]).toBe(pos(i).lat);
      expect(tr.t[k]).toBe(s.tS[i]);
    }
    expect(Array.from(tr.breaks)).toEqual([]);
  });

  it("carries the last link value to rows that only have a position", () => {
    // Position on even rows, LQ on odd rows.
    const s = makeSeries(400, { lat: (i) => (i % 2 ? NaN : pos(i).lat), lon: (i) => (i % 2 ? NaN : pos(i).lon), lqPct: (i) => (i % 2 ? (i === 201 ? 5 : 90) : NaN) });
    const tr = buildTrack(s, findBreaks(s, 0.5), 5);
    expect(tr.t.length).toBe(200);
    expect(Math.min(...Array.from(tr.link).filter((v) => !Number.isNaN(v)))).toBe(5);
    expect(tr.lat[Array.from(tr.link).indexOf(5)]).toBe(pos(202).lat);
  });

  it("colours by the link metric the analysis judges (LQ, else RSSI %, else RSSI dBm, else SNR)", () => {
    const s = makeSeries(10, { lat: (i) => pos(i).lat, lon: (i) => pos(i).lon, snrDb: () => 3, rssiPct: () => 40, rssiDbm: () => -80 });
    expect(buildTrack(s, findBreaks(s, null), null).metric).toBe("rssiPct");
    const dbm = makeSeries(10, { lat: (i) => pos(i).lat, lon: (i) => pos(i).lon, snrDb: () => 3, rssiDbm: () => -80 });
    expect(buildTrack(dbm, findBreaks(dbm, null), null).metric).toBe("rssiDbm");
    const none = makeSeries(10, { lat: (i) => pos(i).lat, lon: (i) => pos(i).lon });
    const tr = buildTrack(none, findBreaks(none, null), null);
    expect(tr.metric).toBeNull();
    expect(Array.from(tr.lat)).toEqual(Array.from({ length: 10 }, (_, i) => pos(i).lat));
  });

  it("starts a new piece at a segment start and after a long stretch without position", () => {
    // 10 Hz; a segment starts at 300; no position from 600 to 699 (10 s).
    const s = makeSeries(1000, {
      lat: (i) => (i >= 600 && i < 700 ? NaN : pos(i).lat),
      lon: (i) => (i >= 600 && i < 700 ? NaN : pos(i).lon),
      segmentStart: (i) => (i === 0 || i === 300 ? 1 : 0),
      fixType: () => 3,
    });
    const tr = buildTrack(s, findBreaks(s, 0.5), 0.5);
    expect(tr.t.length).toBe(900);
    expect(Array.from(tr.breaks)).toEqual([300, 600]);
    expect(tr.t[600]).toBeCloseTo(70, 9);
  });

  it("leaves out positions at 0,0 and explicit no-fix rows", () => {
    const s = makeSeries(6, { lat: [0, 53, 53, 53, 53, 53], lon: [0, -3, -3, -3, -3, -3], fixType: [3, 0, 3, 3, NaN, 3] });
    const tr = buildTrack(s, findBreaks(s, null), null);
    expect(Array.from(tr.t)).toEqual([0.2, 0.3, 0.4, 0.5].map((x) => s.tS[Math.round(x * 10)]));
  });
});
