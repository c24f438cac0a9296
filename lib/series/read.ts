/**
 * The three reads over stored levels: series, track and points. No HTTP, no access checks; the
 * rows come from a BlobSource (MariaDB or memory) and raw samples from a SampleSource.
 */
import type { SampleField } from "@/lib/parsers/types";
import { fromBytes } from "./codec";
import {
  chunkEndSeq, clampRange, decimateLevel, isDerived, outputValue, planRead, rawAsLevel, round7, type LoadedLevel,
} from "./decimate";
import { doubleFields, LEVELS_VERSION, RAW_CHUNK, type SeriesMeta } from "./levels";
import { blobKey, type BlobRows, type BlobSource } from "./store";
import type { PointsResponse, SeriesField, SeriesResponse, TrackMetric, TrackResponse } from "./types";

/** Raw samples in seq order; NaN = no value. */
export interface SampleRows {
  seq: ArrayLike<number>;
  t: ArrayLike<number>;
  values: Partial<Record<SampleField, ArrayLike<number>>>;
}

export interface SampleSource {
  /** Samples lo…hi (inclusive). */
  range(lo: number, hi: number, fields: readonly SampleField[]): Promise<SampleRows>;
  /** The samples with these seqs (ascending). */
  at(seqs: readonly number[], fields: readonly SampleField[]): Promise<SampleRows>;
}

export interface LoadedMeta {
  meta: SeriesMeta;
  tIndex: Float64Array;
}

export interface SeriesQuery {
  fields: SeriesField[];
  from?: number;
  to?: number;
  points: number;
}

export interface PointsQuery {
  fields: SeriesField[];
  points: number;
}

const typeOf = (f: string) => (f === "_tFirst" || f === "_tLast" || f === "_t" ? "f64" : f === "_seq" ? "u32" : f === "_gap" ? "u8" : doubleFields.has(f as SeriesField) ? "f64" : "f32");

function get(rows: BlobRows, kind: Parameters<typeof blobKey>[0], size: number, field: string): Uint8Array[] | undefined {
  return rows.get(blobKey(kind, size, field));
}

/** The meta row and time index, or null when the run has no (current) levels. */
export async function loadMeta(src: BlobSource): Promise<LoadedMeta | null> {
  const rows = await src.read([
    { kind: "meta", bucketSize: 0, fields: ["meta"] },
    { kind: "tindex", bucketSize: 0, fields: ["t"] },
  ]);
  const m = get(rows, "meta", 0, "meta");
  const t = get(rows, "tindex", 0, "t");
  if (!m || !t) return null;
  const meta = JSON.parse(Buffer.from(fromBytes("u8", m)).toString("utf8")) as SeriesMeta;
  if (meta.version !== LEVELS_VERSION) return null;
  return { meta, tIndex: fromBytes("f64", t) };
}

const bit = (bits: Uint8Array, i: number) => (i >= 0 && i >> 3 < bits.length ? (bits[i >> 3] >> (i & 7)) & 1 : 0);

/** The whole-run or zoomed series (SeriesResponse without runId). */
export async function readSeries(src: BlobSource, samples: SampleSource, loaded: LoadedMeta, q: SeriesQuery): Promise<Omit<SeriesResponse, "runId" | "version">> {
  const { meta, tIndex } = loaded;
  const { from, to } = clampRange(meta, q.from, q.to);
  const fields = [...new Set(q.fields)];
  const present = fields.filter((f) => meta.present.includes(f));
  const absent = fields.filter((f) => !meta.present.includes(f));
  const plan = planRead(meta, tIndex, from, to, q.points);
  const req = { fields: present, from, to, points: q.points };
  if (plan.kind === "empty") return { from, to, resolution: "raw", t: [], values: Object.fromEntries(present.map((f) => [f, []])), absent };

  let level: LoadedLevel;
  if (plan.kind === "raw") {
    const sampleFs = present.filter((f) => !isDerived(f)) as SampleField[];
    const derivedFs = present.filter((f) => isDerived(f) && meta.rawDerived.includes(f));
    const c0 = Math.floor(plan.lo / RAW_CHUNK);
    const c1 = Math.floor(plan.hi / RAW_CHUNK);
    const [rows, blobs] = await Promise.all([
      samples.range(plan.lo, plan.hi, sampleFs),
      src.read([{ kind: "raw", bucketSize: 1, fields: ["_break", ...derivedFs], chunks: [c0, c1] }]),
    ]);
    const base = c0 * RAW_CHUNK;
    const bits = fromBytes("u8", get(blobs, "raw", 1, "_break") ?? []);
    const n = rows.t.length;
    const t = new Float64Array(n);
    const breakBefore = new Uint8Array(n);
    let cm = -Infinity;
    for (let i = 0; i < n; i++) {
      // Non-decreasing x, as in the levels (a log's time may step back).
      if (rows.t[i] > cm) cm = rows.t[i];
      t[i] = cm;
      breakBefore[i] = bit(bits, rows.seq[i] - base);
    }
    const values: Partial<Record<SeriesField, ArrayLike<number>>> = { ...rows.values };
    for (const f of derivedFs) {
      const all = fromBytes("f32", get(blobs, "raw", 1, f) ?? []);
      values[f] = Float64Array.from(rows.seq, (s) => (s - base < all.length ? all[s - base] : NaN));
    }
    level = rawAsLevel({ seq: rows.seq, t, breakBefore, values });
  } else {
    const L = meta.levels[plan.level];
    const [c0, c1] = plan.chunks;
    const blobs = await src.read([{ kind: "level", bucketSize: L.size, fields: ["_tFirst", "_tLast", "_seq", "_gap", ...present], chunks: [c0, c1] }]);
    const arr = <T extends "f64" | "f32" | "u32" | "u8">(f: string, type: T) => fromBytes(type, get(blobs, "level", L.size, f) ?? []);
    const values: LoadedLevel["values"] = {};
    for (const f of present) values[f] = arr(f, typeOf(f) as "f32");
    level = { size: L.size, tFirst: arr("_tFirst", "f64"), tLast: arr("_tLast", "f64"), seq: arr("_seq", "u32"), gap: arr("_gap", "u8"), endSeq: chunkEndSeq(meta, L, c1), values };
  }
  const out = decimateLevel(level, req);
  return { from, to, resolution: out.resolution, t: out.t, values: out.values, absent };
}

const metricUnit: Record<TrackMetric, "%" | "dBm" | "dB"> = { lqPct: "%", rssiPct: "%", rssiDbm: "dBm", snrDb: "dB" };

export async function readTrack(src: BlobSource, loaded: LoadedMeta): Promise<Omit<TrackResponse, "runId" | "version">> {
  const rows = await src.read([{ kind: "track", bucketSize: 0, fields: ["t", "lat", "lon", "link", "breaks"] }]);
  const a = (f: string, type: "f64" | "f32" | "u32") => fromBytes(type, get(rows, "track", 0, f) ?? []);
  const metric = loaded.meta.track.metric;
  return {
    metric: metric ? { field: metric, unit: metricUnit[metric] } : null,
    t: Array.from(a("t", "f64")),
    lat: Array.from(a("lat", "f64")),
    lon: Array.from(a("lon", "f64")),
    link: Array.from(a("link", "f32"), (v) => (v === v ? round7(v) : null)),
    breaks: Array.from(a("breaks", "u32")),
  };
}

const POPCOUNT = Uint8Array.from({ length: 256 }, (_, i) => {
  let c = 0;
  for (let v = i; v; v >>= 1) c += v & 1;
  return c;
});

/**
 * Actual samples where every requested field has a value, at an even stride among them. Taken
 * from the stored spread sample when it holds enough of them; else picked exactly from the
 * presence bits and read from the samples.
 */
export async function readPoints(src: BlobSource, samples: SampleSource, loaded: LoadedMeta, q: PointsQuery): Promise<Omit<PointsResponse, "runId" | "version">> {
  const { meta } = loaded;
  const fields = [...new Set(q.fields)];
  const empty = { t: [], values: Object.fromEntries(fields.map((f) => [f, []])), total: 0 };
  if (!fields.every((f) => meta.present.includes(f))) return empty;
  const partial = fields.filter((f) => !meta.full.includes(f));
  const rows = await src.read([
    { kind: "points", bucketSize: 0, fields: ["_seq", "_t", ...fields] },
    { kind: "presence", bucketSize: 0, fields: partial },
  ]);
  // Samples qualifying in the whole run: the AND of the fields' presence bits (all set for a field present everywhere).
  const all = new Uint8Array(Math.ceil(meta.n / 8)).fill(0xff);
  if (meta.n % 8) all[all.length - 1] = (1 << meta.n % 8) - 1;
  for (const f of partial) {
    const b = fromBytes("u8", get(rows, "presence", 0, f) ?? []);
    for (let i = 0; i < all.length; i++) all[i] &= b[i] ?? 0;
  }
  let total = 0;
  for (let i = 0; i < all.length; i++) total += POPCOUNT[all[i]];
  const want = Math.min(q.points, total);
  if (want === 0) return { ...empty, total };

  const seq = fromBytes("u32", get(rows, "points", 0, "_seq") ?? []);
  const ts = fromBytes("f64", get(rows, "points", 0, "_t") ?? []);
  const cols = fields.map((f) => fromBytes(typeOf(f) as "f32", get(rows, "points", 0, f) ?? []));
  const qual: number[] = [];
  for (let k = 0; k < seq.length; k++) if (cols.every((c) => c[k] - c[k] === 0)) qual.push(k);
  const values: Partial<Record<SeriesField, number[]>> = {};
  const fmt = fields.map(outputValue);
  if (qual.length >= want) {
    const pick = Array.from({ length: want }, (_, j) => qual[Math.floor((j * qual.length) / want)]);
    fields.forEach((f, i) => (values[f] = pick.map((k) => fmt[i](cols[i][k]))));
    return { t: pick.map((k) => ts[k]), values, total };
  }

  // Too few in the stored sample: pick among all qualifying samples by rank.
  const picks: number[] = [];
  let rank = 0;
  let next = 0;
  for (let byte = 0; byte < all.length && picks.length < want; byte++) {
    const v = all[byte];
    if (!v) continue;
    for (let b = 0; b < 8; b++) {
      if (!((v >> b) & 1)) continue;
      if (rank === Math.floor((next * total) / want)) {
        picks.push(byte * 8 + b);
        next++;
      }
      rank++;
    }
  }
  const sampleFs = fields.filter((f) => !isDerived(f)) as SampleField[];
  const derivedFs = fields.filter(isDerived);
  const got = await samples.at(picks, sampleFs);
  const bySeq = new Map<number, number>();
  for (let i = 0; i < got.seq.length; i++) bySeq.set(got.seq[i], i);
  const derived: Partial<Record<SeriesField, Float32Array>> = {};
  let c0 = 0;
  if (derivedFs.length) {
    c0 = Math.floor(picks[0] / RAW_CHUNK);
    const c1 = Math.floor(picks[picks.length - 1] / RAW_CHUNK);
    const raw = await src.read([{ kind: "raw", bucketSize: 1, fields: derivedFs, chunks: [c0, c1] }]);
    for (const f of derivedFs) derived[f] = fromBytes("f32", get(raw, "raw", 1, f) ?? []);
  }
  const kept = picks.filter((s) => bySeq.has(s));
  fields.forEach((f, i) => {
    values[f] = kept.map((s) => fmt[i](isDerived(f) ? derived[f]![s - c0 * RAW_CHUNK] : got.values[f as SampleField]![bySeq.get(s)!]));
  });
  return { t: kept.map((s) => got.t[bySeq.get(s)!]), values, total };
}
