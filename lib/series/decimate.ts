/**
 * From stored levels (or raw rows) to a SeriesResponse: the level choice, bucket merging, the two x
 * positions per bucket and the null rows at breaks. Pure.
 */
import { doubleFields, type LevelMeta, type SeriesMeta } from "./levels";
import { derivedFields, type SeriesField } from "./types";

/**
 * A run of consecutive buckets of one level, as loaded. Raw samples are a level of size 1 whose
 * pairs hold the sample's value twice.
 */
export interface LoadedLevel {
  /** Nominal samples per bucket; 1 = raw samples. */
  size: number;
  tFirst: ArrayLike<number>;
  tLast: ArrayLike<number>;
  /** First sample of each bucket. */
  seq: ArrayLike<number>;
  /** Seq just past the last loaded bucket. */
  endSeq: number;
  /** 1 where a bucket starts after a break (segment start or reception gap). */
  gap: ArrayLike<number>;
  /** Interleaved [a0, b0, a1, b1, …]: each bucket's min and max in time order; NaN = no value. */
  values: Partial<Record<SeriesField, ArrayLike<number>>>;
}

export interface DecimateRequest {
  fields: readonly SeriesField[];
  from: number;
  to: number;
  points: number;
}

export interface Decimated {
  t: number[];
  values: Partial<Record<SeriesField, (number | null)[]>>;
  resolution: "raw" | number;
}

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

/** v to 7 significant digits (what a 32-bit float holds): "-80.3", not "-80.30000305175781". */
export function round7(v: number): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  const d = 6 - Math.floor(Math.log10(Math.abs(v)));
  if (d > 22 || d < -22) return Number(v.toPrecision(7));
  return d >= 0 ? Math.round(v * POW10[d]) / POW10[d] : Math.round(v / POW10[-d]) * POW10[-d];
}

const round6dp = (v: number) => Math.round(v * 1e6) / 1e6;

/** Output rounding per field: doubles as stored, 32-bit floats to the digits they carry. */
export const outputValue = (f: SeriesField) => (doubleFields.has(f) ? (v: number) => v : round7);

/** First index in [lo, hi) with a[i] ≥ x (a non-decreasing); hi when none. */
export function lowerBound(a: ArrayLike<number>, x: number, lo = 0, hi = a.length): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** First index in [lo, hi) with a[i] > x; hi when none. */
export function upperBound(a: ArrayLike<number>, x: number, lo = 0, hi = a.length): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Buckets overlapping [from, to], merged m at a time (never across a break) so at most `points`
 * x positions come out: two per bucket (its min and max in time order, at its first and last
 * time), one for a single sample; a null row between two pieces.
 */
export function decimateLevel(level: LoadedLevel, req: DecimateRequest): Decimated {
  const count = level.tFirst.length;
  const b0 = lowerBound(level.tLast, req.from, 0, count);
  const b1 = upperBound(level.tFirst, req.to, b0, count);
  const inRange = b1 - b0;
  let m: number;
  if (level.size === 1 && inRange <= req.points) m = 1;
  else m = Math.max(1, Math.ceil(inRange / Math.max(1, Math.floor(req.points / 2))));
  const t: number[] = [];
  const fields = req.fields.filter((f) => level.values[f]);
  const cols = fields.map((f) => ({ f, src: level.values[f]!, out: [] as (number | null)[], fmt: outputValue(f) }));
  const seqAt = (b: number) => (b < count ? level.seq[b] : level.endSeq);
  let prevLast = NaN;
  let b = b0;
  while (b < b1) {
    // A group ends after m buckets or before the next break.
    let e = b + 1;
    while (e < b1 && e - b < m && !level.gap[e]) e++;
    const tA = level.tFirst[b];
    const tB = level.tLast[e - 1];
    if (level.gap[b] && t.length) {
      t.push(round6dp((prevLast + tA) / 2));
      for (const c of cols) c.out.push(null);
    }
    const single = seqAt(e) - seqAt(b) === 1;
    t.push(tA);
    if (!single) t.push(tB);
    for (const c of cols) {
      const src = c.src;
      let mn = Infinity;
      let mx = -Infinity;
      let kmn = -1;
      let kmx = -1;
      for (let k = 2 * b, hi = 2 * e; k < hi; k++) {
        const v = src[k];
        if (v !== v) continue;
        if (v < mn) (mn = v), (kmn = k);
        if (v > mx) (mx = v), (kmx = k);
      }
      if (kmn < 0) {
        c.out.push(null);
        if (!single) c.out.push(null);
      } else if (single) c.out.push(c.fmt(mn));
      else if (kmn <= kmx) c.out.push(c.fmt(mn), c.fmt(mx));
      else c.out.push(c.fmt(mx), c.fmt(mn));
    }
    prevLast = tB;
    b = e;
  }
  const values: Decimated["values"] = {};
  for (const c of cols) values[c.f] = c.out;
  return { t, values, resolution: level.size === 1 && m === 1 ? "raw" : level.size * m };
}

/** Raw samples (ascending seq) as a size-1 level. `t` must be non-decreasing. */
export function rawAsLevel(rows: {
  seq: ArrayLike<number>;
  t: ArrayLike<number>;
  breakBefore: ArrayLike<number>;
  values: Partial<Record<SeriesField, ArrayLike<number>>>;
}): LoadedLevel {
  const n = rows.t.length;
  const values: LoadedLevel["values"] = {};
  for (const [f, src] of Object.entries(rows.values) as [SeriesField, ArrayLike<number>][]) {
    const pair = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      const v = src[i];
      pair[2 * i] = pair[2 * i + 1] = v - v === 0 ? v : NaN;
    }
    values[f] = pair;
  }
  return { size: 1, tFirst: rows.t, tLast: rows.t, seq: rows.seq, endSeq: n ? rows.seq[n - 1] + 1 : 0, gap: rows.breakBefore, values };
}

/** A request's range clamped to the run; NaN-free. */
export function clampRange(meta: Pick<SeriesMeta, "tEnd">, from: number | undefined, to: number | undefined) {
  const lo = Math.max(0, Math.min(from ?? 0, meta.tEnd));
  const hi = Math.max(lo, Math.min(to ?? meta.tEnd, meta.tEnd));
  return { from: lo, to: hi };
}

/**
 * The seq range whose samples may fall in [from, to], from the time index (a superset, at most
 * two index steps wider than exact); null when none can.
 */
export function seqRange(meta: Pick<SeriesMeta, "n" | "timeIndexStep">, tIndex: ArrayLike<number>, from: number, to: number): { lo: number; hi: number } | null {
  if (!meta.n || !tIndex.length) return null;
  const step = meta.timeIndexStep;
  const seqAt = (k: number) => Math.min(k * step, meta.n - 1);
  // Samples before index entry k0 − 1 are all earlier than `from`; those after k1 all later than `to`.
  const k0 = lowerBound(tIndex, from);
  const k1 = upperBound(tIndex, to);
  if (k0 >= tIndex.length && tIndex[tIndex.length - 1] < from) return null;
  const lo = k0 > 0 ? seqAt(k0 - 1) : 0;
  const hi = k1 < tIndex.length ? seqAt(k1) : meta.n - 1;
  return hi < lo ? null : { lo, hi };
}

export type Plan = { kind: "raw"; lo: number; hi: number } | { kind: "level"; level: number; chunks: [number, number]; lo: number; hi: number } | { kind: "empty" };

/** Raw rows are read and binned on the fly up to this many times `points`: finer than the first level there. */
export const RAW_READ_FACTOR = 4;
/** A level may have up to this many times `points` / 2 buckets in range; they are merged on read. */
export const LEVEL_MERGE_MAX = 4;

/**
 * Raw samples when the range holds at most about RAW_READ_FACTOR × `points` samples (returned as
 * they are when they fit, else binned); otherwise the finest level with at most LEVEL_MERGE_MAX ×
 * `points` / 2 buckets in range (merged to `points` / 2 on read), or the coarsest, merged further.
 */
export function planRead(meta: SeriesMeta, tIndex: ArrayLike<number>, from: number, to: number, points: number): Plan {
  const r = seqRange(meta, tIndex, from, to);
  if (!r) return { kind: "empty" };
  const estimate = r.hi - r.lo + 1;
  if (estimate <= RAW_READ_FACTOR * points + 2 * meta.timeIndexStep || !meta.levels.length) return { kind: "raw", ...r };
  const most = (LEVEL_MERGE_MAX * points) / 2;
  let li = meta.levels.findIndex((L) => Math.ceil(estimate / L.size) <= most);
  if (li < 0) li = meta.levels.length - 1;
  return { kind: "level", level: li, chunks: chunkRange(meta.levels[li], r.lo, r.hi), ...r };
}

/** The stored chunks of a level that hold buckets of samples lo…hi. */
export function chunkRange(L: LevelMeta, lo: number, hi: number): [number, number] {
  const c0 = Math.max(0, upperBound(L.chunkSeq, lo) - 1);
  const c1 = Math.max(c0, upperBound(L.chunkSeq, hi) - 1);
  return [c0, c1];
}

/** Seq just past the chunk range's last bucket. */
export function chunkEndSeq(meta: SeriesMeta, L: LevelMeta, c1: number): number {
  return c1 + 1 < L.chunkSeq.length ? L.chunkSeq[c1 + 1] : meta.n;
}

export const isDerived = (f: SeriesField) => (derivedFields as readonly string[]).includes(f);
