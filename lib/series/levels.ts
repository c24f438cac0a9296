/**
 * Display levels of one run, built once at ingest so a chart read never scans the samples table:
 * a pyramid of min/max buckets (16, 128, 1024… samples, ×8, until a level has ≤ 1000 buckets), the
 * map's track overview, a spread sample of whole rows for scatter plots, per-field presence bits,
 * and the derived per-sample values (which the samples table does not hold).
 *
 * Pure: reads typed arrays, yields typed arrays (no I/O). A generator, so ingest can write each
 * piece and drop it: beyond its inputs it holds O(n/16) memory (the finest level's bucket index and
 * one field's finest level at a time).
 */
import type { RunSeries } from "@/lib/analysis/types";
import type { Stored } from "./codec";
import { derivedFields, seriesFields, trackMetrics, type SeriesField, type TrackMetric } from "./types";

/** Bumped when the stored layout changes; older levels are then rebuilt on read. */
export const LEVELS_VERSION = 1;
export const BASE_BUCKET = 16;
export const LEVEL_FACTOR = 8;
/** Levels stop once one has at most this many buckets. */
export const TOP_MAX_BUCKETS = 1000;
/** Buckets per stored row of a level; a zoomed read fetches only the rows it needs. */
export const LEVEL_CHUNK = 8192;
/** Samples per stored row of per-sample data (derived values, break bits): 256 KB of 32-bit floats. */
export const RAW_CHUNK = 65536;
/** A time step longer than this many median steps is a reception gap. */
export const GAP_FACTOR = 5;
/** Whole rows kept for scatter plots: enough that a field pair present in a quarter of the rows still fills MAX_POINTS. */
export const POINTS_STORED = 20000;
export const TRACK_POINTS = 4000;
/** Track pieces split at most this many times; a log that breaks more often is drawn joined past it. */
export const TRACK_MAX_SPLITS = 2000;
export const TIME_INDEX_ENTRIES = 4096;

/** Kept as doubles, as in the samples table; the rest as 32-bit floats (FLOAT columns, metres for derived). */
export const doubleFields: ReadonlySet<SeriesField> = new Set<SeriesField>(["lat", "lon"]);

export type BlobKind = "meta" | "tindex" | "level" | "raw" | "points" | "presence" | "track";
export const blobKinds = ["meta", "tindex", "level", "raw", "points", "presence", "track"] as const satisfies readonly BlobKind[];

/** One stored row: `data` little-endian (see codec.ts). */
export interface SeriesBlob {
  kind: BlobKind;
  bucketSize: number;
  field: string;
  chunk: number;
  data: Stored;
}

export interface LevelMeta {
  /** Nominal samples per bucket (a bucket holds at most this many; fewer before a break). */
  size: number;
  count: number;
  /** Seq of the first bucket of each stored chunk. */
  chunkSeq: number[];
}

/** What a reader needs before it fetches anything else; stored last, so its presence means "complete". */
export interface SeriesMeta {
  version: number;
  n: number;
  /** Last x position (s): times are made non-decreasing by a running maximum (logs may step back). */
  tEnd: number;
  medianStepS: number | null;
  /** Steps longer than this are reception gaps (GAP_FACTOR × median); null with fewer than 2 distinct times. */
  gapStepS: number | null;
  /** Fields with at least one value; only these have levels, presence bits and point values. */
  present: SeriesField[];
  /** Present fields with a value at every sample: no presence bits stored for them. */
  full: SeriesField[];
  /** Derived fields with per-sample values stored (kind "raw"). */
  rawDerived: SeriesField[];
  levels: LevelMeta[];
  /** tindex holds the x position at seq min(k × step, n − 1), k = 0, 1, … */
  timeIndexStep: number;
  points: number;
  track: { metric: TrackMetric | null; count: number };
  /** Samples that start after a break (segment start, gap, or time going back). */
  breaks: number;
}

/** Derived per-sample arrays from the analysis; absent when levels are rebuilt from stored samples. */
export interface DerivedSeries {
  distanceFromHomeM?: ArrayLike<number> | null;
  xteM?: ArrayLike<number> | null;
  rssiRcPct?: ArrayLike<number> | null;
}

const NONE = 0xffffffff;
const isFiniteNum = (v: number) => v - v === 0;

function column(series: RunSeries, derived: DerivedSeries, f: SeriesField): ArrayLike<number> | null {
  if ((derivedFields as readonly string[]).includes(f)) {
    const a = derived[f as keyof DerivedSeries];
    return a && a.length === series.n ? a : null;
  }
  return (series as unknown as Record<string, ArrayLike<number>>)[f] ?? null;
}

function hasAny(a: ArrayLike<number>): boolean {
  for (let i = 0; i < a.length; i++) if (isFiniteNum(a[i])) return true;
  return false;
}

function medianOf(a: Float64Array): number {
  if (!a.length) return NaN;
  a.sort();
  const m = a.length >> 1;
  return a.length % 2 ? a[m] : (a[m - 1] + a[m]) / 2;
}

export const hasPosition = (lat: number, lon: number, fix: number) =>
  isFiniteNum(lat) && isFiniteNum(lon) && !(lat === 0 && lon === 0) && fix !== 0;

/**
 * Median time step and median step between samples with a position, each over at most 65,536 steps
 * taken at an even stride (exact for shorter runs); positive steps only, so repeated timestamps do
 * not make every step a gap.
 */
export function timeSteps(series: RunSeries): { medianStepS: number; positionStepS: number } {
  const { n, tS, lat, lon, fixType } = series;
  const stride = Math.max(1, Math.ceil(n / 65536));
  const steps = new Float64Array(Math.ceil(n / stride) + 1);
  const posSteps = new Float64Array(Math.ceil(n / stride) + 1);
  let k = 0;
  let kp = 0;
  let positions = 0;
  let lastPosT = NaN;
  for (let i = 0; i < n; i++) {
    if (i > 0 && i % stride === 0) {
      const d = tS[i] - tS[i - 1];
      if (d > 0) steps[k++] = d;
    }
    if (hasPosition(lat[i], lon[i], fixType[i])) {
      if (positions++ % stride === 0 && lastPosT === lastPosT) {
        const d = tS[i] - lastPosT;
        if (d > 0) posSteps[kp++] = d;
      }
      lastPosT = tS[i];
    }
  }
  return { medianStepS: medianOf(steps.subarray(0, k)), positionStepS: medianOf(posSteps.subarray(0, kp)) };
}

interface Breaks {
  /** Sample indices (ascending) of the breaks the levels may honour. */
  index: Uint32Array;
  /** 0 = the most important (segment starts first, then longer gaps). */
  rank: Uint32Array;
  /** Every break, one bit per sample. */
  bits: Uint8Array;
  total: number;
}

/**
 * Samples that must not be joined to the one before: segment starts, steps longer than gapStepS,
 * and time going backwards. The levels keep at most ceil(n/16) of them (by rank); the bit set keeps all.
 */
export function findBreaks(series: RunSeries, gapStepS: number | null): Breaks {
  const { n, tS, segmentStart } = series;
  const cap = Math.ceil(n / BASE_BUCKET) + 64;
  const index = new Uint32Array(cap);
  const score = new Float64Array(cap);
  const bits = new Uint8Array(Math.ceil(n / 8));
  let g = 0;
  let total = 0;
  for (let i = 1; i < n; i++) {
    const d = tS[i] - tS[i - 1];
    const seg = segmentStart[i] === 1;
    if (!seg && !(d < 0) && !(gapStepS !== null && d > gapStepS)) continue;
    bits[i >> 3] |= 1 << (i & 7);
    total++;
    if (g < cap) {
      index[g] = i;
      // Segment starts are the log's own word; then the longest gaps.
      score[g++] = (seg ? 1e15 : 0) + (d === d ? Math.abs(d) : 0);
    }
  }
  const order = Uint32Array.from({ length: g }, (_, i) => i).sort((a, b) => score[b] - score[a] || a - b);
  const rank = new Uint32Array(g);
  for (let r = 0; r < g; r++) rank[order[r]] = r;
  return { index: index.slice(0, g), rank, bits, total };
}

/** How many breaks a level of `size` honours: at most one per two buckets, so breaks cannot swamp it. */
const honoured = (n: number, size: number) => Math.floor(Math.ceil(n / size) / 2);

/** One level's bucket index during the build. */
export interface LevelIndex {
  size: number;
  count: number;
  /** First sample of each bucket, plus n at [count]. */
  seq: Uint32Array;
  tFirst: Float64Array;
  tLast: Float64Array;
  /** Rank of the honoured break the bucket starts at, NONE otherwise. */
  gapRank: Uint32Array;
  /** For levels above the first: first child bucket of each bucket, plus the child count at [count]. */
  children: Uint32Array | null;
}

/** Buckets of at most BASE_BUCKET samples, never across an honoured break; plus the time index. */
function baseLevel(series: RunSeries, br: Breaks): { level: LevelIndex; tIndex: Float64Array; timeIndexStep: number } {
  const { n, tS } = series;
  const K = honoured(n, BASE_BUCKET);
  const cap = Math.ceil(n / BASE_BUCKET) + Math.min(K, br.index.length) + 1;
  const seq = new Uint32Array(cap + 1);
  const tFirst = new Float64Array(cap);
  const tLast = new Float64Array(cap);
  const gapRank = new Uint32Array(cap);
  const timeIndexStep = Math.max(1, Math.ceil(n / TIME_INDEX_ENTRIES));
  const tIndex = new Float64Array(n ? Math.ceil((n - 1) / timeIndexStep) + 1 : 0);
  let cm = -Infinity;
  let b = 0;
  let bp = 0;
  let startRank = NONE;
  let i = 0;
  while (i < n) {
    while (bp < br.index.length && (br.index[bp] <= i || br.rank[bp] >= K)) bp++;
    const next = bp < br.index.length ? br.index[bp] : n;
    const end = Math.min(i + BASE_BUCKET, n, next);
    seq[b] = i;
    gapRank[b] = startRank;
    for (let j = i; j < end; j++) {
      const t = tS[j];
      if (t > cm) cm = t;
      if (j === i) tFirst[b] = cm;
      if (j % timeIndexStep === 0) tIndex[j / timeIndexStep] = cm;
    }
    tLast[b] = cm;
    startRank = end === next && end < n ? br.rank[bp] : NONE;
    b++;
    i = end;
  }
  if (n) tIndex[tIndex.length - 1] = cm;
  seq[b] = n;
  const level = { size: BASE_BUCKET, count: b, seq: seq.slice(0, b + 1), tFirst: tFirst.slice(0, b), tLast: tLast.slice(0, b), gapRank: gapRank.slice(0, b), children: null };
  return { level, tIndex, timeIndexStep };
}

/** The next level: children merged greedily up to `size` samples, not across a break it honours. */
function parentLevel(child: LevelIndex, n: number): LevelIndex {
  const size = child.size * LEVEL_FACTOR;
  const K = honoured(n, size);
  const starts = (c: number, first: number) =>
    c === first || (child.gapRank[c] < K) || child.seq[c + 1] - child.seq[first] > size;
  let count = 0;
  for (let c = 0, first = 0; c < child.count; c++) if (starts(c, first)) (first = c), count++;
  const seq = new Uint32Array(count + 1);
  const tFirst = new Float64Array(count);
  const tLast = new Float64Array(count);
  const gapRank = new Uint32Array(count);
  const children = new Uint32Array(count + 1);
  let p = -1;
  for (let c = 0, first = 0; c < child.count; c++) {
    if (starts(c, first)) {
      first = c;
      p++;
      seq[p] = child.seq[c];
      tFirst[p] = child.tFirst[c];
      gapRank[p] = child.gapRank[c] < K ? child.gapRank[c] : NONE;
      children[p] = c;
    }
    tLast[p] = child.tLast[c];
  }
  seq[count] = n;
  children[count] = child.count;
  return { size, count, seq, tFirst, tLast, gapRank, children };
}

/** Every level's index, finest first, until one has at most TOP_MAX_BUCKETS buckets. */
export function buildLevelIndexes(series: RunSeries, br: Breaks) {
  const base = baseLevel(series, br);
  const levels: LevelIndex[] = [base.level];
  for (;;) {
    const last = levels[levels.length - 1];
    if (last.count <= TOP_MAX_BUCKETS) break;
    const next = parentLevel(last, series.n);
    if (next.count >= last.count) break;
    levels.push(next);
  }
  return { levels, tIndex: base.tIndex, timeIndexStep: base.timeIndexStep };
}

/**
 * Min and max of each bucket of the finest level, interleaved [a0, b0, a1, b1, …] with a/b the
 * two in time order; NaN, NaN for a bucket without a value. Also sets the field's presence bits.
 */
export function baseMinMax(x: ArrayLike<number>, level: LevelIndex, out: Float32Array | Float64Array, bits: Uint8Array | null): number {
  let count = 0;
  for (let b = 0; b < level.count; b++) {
    let mn = Infinity;
    let mx = -Infinity;
    let imn = -1;
    let imx = -1;
    for (let j = level.seq[b], hi = level.seq[b + 1]; j < hi; j++) {
      const v = x[j];
      if (!isFiniteNum(v)) continue;
      count++;
      if (bits) bits[j >> 3] |= 1 << (j & 7);
      if (v < mn) (mn = v), (imn = j);
      if (v > mx) (mx = v), (imx = j);
    }
    if (imn < 0) out[2 * b] = out[2 * b + 1] = NaN;
    else if (imn <= imx) (out[2 * b] = mn), (out[2 * b + 1] = mx);
    else (out[2 * b] = mx), (out[2 * b + 1] = mn);
  }
  return count;
}

/**
 * Min/max of a parent level from its children's interleaved pairs. The pairs are in time order, so
 * the position in the interleaved array orders the parent's min and max too.
 */
export function parentMinMax(childValues: ArrayLike<number>, level: LevelIndex, out: Float32Array | Float64Array): void {
  const ch = level.children!;
  for (let p = 0; p < level.count; p++) {
    let mn = Infinity;
    let mx = -Infinity;
    let kmn = -1;
    let kmx = -1;
    for (let k = 2 * ch[p], hi = 2 * ch[p + 1]; k < hi; k++) {
      const v = childValues[k];
      if (v !== v) continue;
      if (v < mn) (mn = v), (kmn = k);
      if (v > mx) (mx = v), (kmx = k);
    }
    if (kmn < 0) out[2 * p] = out[2 * p + 1] = NaN;
    else if (kmn <= kmx) (out[2 * p] = mn), (out[2 * p + 1] = mx);
    else (out[2 * p] = mx), (out[2 * p + 1] = mn);
  }
}

/** Sample indices for the stored scatter rows: one at a hashed offset in each of m even windows (no aliasing with periodic logs). */
export function pointIndices(n: number, m = POINTS_STORED): Uint32Array {
  if (n <= m) return Uint32Array.from({ length: n }, (_, i) => i);
  const out = new Uint32Array(m);
  for (let k = 0; k < m; k++) {
    const lo = Math.floor((k * n) / m);
    const hi = Math.floor(((k + 1) * n) / m);
    out[k] = lo + Math.floor(unitHash(k) * (hi - lo));
  }
  return out;
}

/** A fixed pseudo-random number in [0, 1) for k (a 32-bit integer mix; common practice). */
function unitHash(k: number): number {
  let h = Math.imul(k ^ 0x9e3779b9, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return (h >>> 0) / 4294967296;
}

/** The track overview (TrackResponse), columnar. */
export interface TrackOverview {
  metric: TrackMetric | null;
  t: Float64Array;
  lat: Float64Array;
  lon: Float64Array;
  link: Float32Array;
  breaks: Uint32Array;
}

/**
 * At most ~TRACK_POINTS samples with a position for the map: consecutive position samples in equal
 * buckets, from each the one with the worst link (the last link value seen, so logs that write
 * position and link on different rows still count), else the first. The link is the judged
 * metric's column, else `rcRssiPct` (RSSI read from the link sheet's channel), else SNR. A new piece starts after a
 * break or when no position came for longer than `positionGapS`.
 */
export function buildTrack(series: RunSeries, br: Breaks, positionGapS: number | null, rcRssiPct?: ArrayLike<number> | null): TrackOverview {
  const { n, tS, lat, lon, fixType } = series;
  // The analysis' order: a logged LQ or RSSI column, then RSSI read from the link sheet's channel, then SNR.
  const logged = trackMetrics.find((f) => f !== "snrDb" && hasAny(series[f]));
  const fromChannel = !logged && rcRssiPct && rcRssiPct.length === n && hasAny(rcRssiPct) ? rcRssiPct : null;
  const metric: TrackMetric | null = logged ?? (fromChannel ? "rssiPct" : hasAny(series.snrDb) ? "snrDb" : null);
  const m: ArrayLike<number> | null = fromChannel ?? (metric ? series[metric] : null);
  let positions = 0;
  for (let i = 0; i < n; i++) if (hasPosition(lat[i], lon[i], fixType[i])) positions++;
  const per = Math.max(1, Math.ceil(positions / TRACK_POINTS));
  const cap = Math.ceil(positions / per) + TRACK_MAX_SPLITS + 1;
  const out = { t: new Float64Array(cap), lat: new Float64Array(cap), lon: new Float64Array(cap), link: new Float32Array(cap) };
  const breaks: number[] = [];
  let k = 0;
  let inBucket = 0;
  let best = -1;
  let bestLink = NaN;
  let bestT = 0;
  let carried = NaN;
  let cm = -Infinity;
  let lastPosT = NaN;
  let pendingBreak = false;
  let splits = 0;
  const flush = () => {
    if (best < 0) return;
    out.t[k] = bestT;
    out.lat[k] = lat[best];
    out.lon[k] = lon[best];
    out.link[k] = bestLink;
    k++;
    best = -1;
    bestLink = NaN;
    inBucket = 0;
  };
  for (let i = 0; i < n; i++) {
    if (tS[i] > cm) cm = tS[i];
    if (i > 0 && br.bits[i >> 3] & (1 << (i & 7))) {
      pendingBreak = true;
      carried = NaN;
    }
    if (m && isFiniteNum(m[i])) carried = m[i];
    if (!hasPosition(lat[i], lon[i], fixType[i])) continue;
    if (positionGapS !== null && lastPosT === lastPosT && tS[i] - lastPosT > positionGapS) pendingBreak = true;
    lastPosT = tS[i];
    if (pendingBreak && k + (best >= 0 ? 1 : 0) > 0 && splits < TRACK_MAX_SPLITS) {
      flush();
      breaks.push(k);
      splits++;
    }
    pendingBreak = false;
    if (inBucket === per) flush();
    inBucket++;
    if (best < 0 || (carried === carried && !(bestLink <= carried))) {
      best = i;
      bestLink = carried;
      bestT = cm;
    }
  }
  flush();
  return { metric, t: out.t.slice(0, k), lat: out.lat.slice(0, k), lon: out.lon.slice(0, k), link: out.link.slice(0, k), breaks: Uint32Array.from(breaks) };
}

const valuesArray = (f: SeriesField, len: number) => (doubleFields.has(f) ? new Float64Array(len) : new Float32Array(len));

/**
 * Everything the series, track and points endpoints read for one run, as rows to store. The
 * meta row comes last.
 * @param series the run as the analysis saw it
 * @param derived per-sample derived values (analyseRun's `perSample`), aligned with `series`
 * @example for (const blob of seriesBlobs(series, analysis.perSample)) await write(blob);
 */
export function* seriesBlobs(series: RunSeries, derived: DerivedSeries = {}): Generator<SeriesBlob, SeriesMeta> {
  const n = series.n;
  const { medianStepS, positionStepS } = timeSteps(series);
  const gapStepS = medianStepS > 0 ? GAP_FACTOR * medianStepS : null;
  const br = findBreaks(series, gapStepS);
  const { levels, tIndex, timeIndexStep } = buildLevelIndexes(series, br);

  yield { kind: "tindex", bucketSize: 0, field: "t", chunk: 0, data: tIndex };
  const levelMeta: LevelMeta[] = [];
  for (const L of levels) {
    const chunks = Math.ceil(L.count / LEVEL_CHUNK);
    const chunkSeq: number[] = [];
    const gap = new Uint8Array(L.count);
    for (let b = 0; b < L.count; b++) gap[b] = L.gapRank[b] === NONE ? 0 : 1;
    for (let c = 0; c < chunks; c++) {
      const lo = c * LEVEL_CHUNK;
      const hi = Math.min(L.count, lo + LEVEL_CHUNK);
      chunkSeq.push(L.seq[lo]);
      const base = { kind: "level" as const, bucketSize: L.size, chunk: c };
      yield { ...base, field: "_tFirst", data: L.tFirst.subarray(lo, hi) };
      yield { ...base, field: "_tLast", data: L.tLast.subarray(lo, hi) };
      yield { ...base, field: "_seq", data: L.seq.subarray(lo, hi) };
      yield { ...base, field: "_gap", data: gap.subarray(lo, hi) };
    }
    levelMeta.push({ size: L.size, count: L.count, chunkSeq });
  }

  const picks = pointIndices(n);
  const present: SeriesField[] = [];
  const full: SeriesField[] = [];
  for (const f of seriesFields) {
    const x = column(series, derived, f);
    if (!x || !hasAny(x)) continue;
    present.push(f);
    const bits = new Uint8Array(Math.ceil(n / 8));
    let values = valuesArray(f, 2 * levels[0].count);
    const count = baseMinMax(x, levels[0], values, bits);
    for (let li = 0; li < levels.length; li++) {
      const L = levels[li];
      if (li > 0) {
        const parent = valuesArray(f, 2 * L.count);
        parentMinMax(values, L, parent);
        values = parent;
      }
      for (let c = 0, chunks = Math.ceil(L.count / LEVEL_CHUNK); c < chunks; c++) {
        const lo = c * LEVEL_CHUNK;
        yield { kind: "level", bucketSize: L.size, field: f, chunk: c, data: values.subarray(2 * lo, 2 * Math.min(L.count, lo + LEVEL_CHUNK)) };
      }
    }
    if (count === n) full.push(f);
    else yield { kind: "presence", bucketSize: 0, field: f, chunk: 0, data: bits };
    const pv = valuesArray(f, picks.length);
    for (let k = 0; k < picks.length; k++) pv[k] = x[picks[k]];
    yield { kind: "points", bucketSize: 0, field: f, chunk: 0, data: pv };
  }
  yield { kind: "points", bucketSize: 0, field: "_seq", chunk: 0, data: picks };
  yield { kind: "points", bucketSize: 0, field: "_t", chunk: 0, data: Float64Array.from(picks, (i) => series.tS[i]) };

  const rawDerived: SeriesField[] = [];
  for (const f of derivedFields) {
    if (!present.includes(f)) continue;
    const x = column(series, derived, f)!;
    rawDerived.push(f);
    for (let c = 0, lo = 0; lo < n; c++, lo += RAW_CHUNK) {
      const hi = Math.min(n, lo + RAW_CHUNK);
      const chunk = new Float32Array(hi - lo);
      for (let i = lo; i < hi; i++) chunk[i - lo] = x[i];
      yield { kind: "raw", bucketSize: 1, field: f, chunk: c, data: chunk };
    }
  }
  // No rows when there is no break: readers take a missing row as all zeros.
  for (let c = 0, lo = 0; br.total && lo < n; c++, lo += RAW_CHUNK) {
    yield { kind: "raw", bucketSize: 1, field: "_break", chunk: c, data: br.bits.subarray(lo / 8, Math.ceil(Math.min(n, lo + RAW_CHUNK) / 8)) };
  }

  const positionGapS = positionStepS > 0 ? Math.max(GAP_FACTOR * positionStepS, gapStepS ?? 0) : gapStepS;
  const track = buildTrack(series, br, positionGapS, derived.rssiRcPct);
  for (const f of ["t", "lat", "lon", "link", "breaks"] as const) yield { kind: "track", bucketSize: 0, field: f, chunk: 0, data: track[f] };

  const meta: SeriesMeta = {
    version: LEVELS_VERSION,
    n,
    tEnd: n ? tIndex[tIndex.length - 1] : 0,
    medianStepS: medianStepS > 0 ? medianStepS : null,
    gapStepS,
    present,
    full,
    rawDerived,
    levels: levelMeta,
    timeIndexStep,
    points: picks.length,
    track: { metric: track.metric, count: track.t.length },
    breaks: br.total,
  };
  yield { kind: "meta", bucketSize: 0, field: "meta", chunk: 0, data: new TextEncoder().encode(JSON.stringify(meta)) };
  return meta;
}
