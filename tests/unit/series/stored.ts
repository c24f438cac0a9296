/**
 * Builds a run's stored levels in memory and reads them back, for the series tests (our own
 * synthetic data).
 */
import type { RunSeries } from "@/lib/analysis/types";
import { fromBytes } from "@/lib/series/codec";
import { doubleFields, seriesBlobs, type DerivedSeries, type SeriesBlob, type SeriesMeta } from "@/lib/series/levels";
import { loadMeta, type LoadedMeta, type SampleRows, type SampleSource } from "@/lib/series/read";
import { memoryBlobSource, type BlobSource } from "@/lib/series/store";
import type { SampleField } from "@/lib/parsers/types";
import type { SeriesField } from "@/lib/series/types";

export interface Built {
  blobs: SeriesBlob[];
  meta: SeriesMeta;
  source: BlobSource;
  loaded: LoadedMeta;
  samples: SampleSource & { calls: number };
}

/** Every row seriesBlobs yields, a memory BlobSource over them, and a SampleSource over the series itself. */
export async function build(series: RunSeries, derived: DerivedSeries = {}): Promise<Built> {
  const gen = seriesBlobs(series, derived);
  const blobs: SeriesBlob[] = [];
  let meta: SeriesMeta;
  for (;;) {
    const r = gen.next();
    if (r.done) {
      meta = r.value;
      break;
    }
    blobs.push(r.value);
  }
  const source = memoryBlobSource(blobs);
  const loaded = (await loadMeta(source))!;
  return { blobs, meta, source, loaded, samples: seriesSampleSource(series) };
}

export function seriesSampleSource(series: RunSeries): SampleSource & { calls: number } {
  const pick = (seqs: number[], fields: readonly SampleField[]): SampleRows => ({
    seq: seqs,
    t: seqs.map((s) => series.tS[s]),
    values: Object.fromEntries(fields.map((f) => [f, seqs.map((s) => (series as unknown as Record<string, ArrayLike<number>>)[f][s])])),
  });
  const src = {
    calls: 0,
    async range(lo: number, hi: number, fields: readonly SampleField[]) {
      src.calls++;
      return pick(Array.from({ length: Math.max(0, Math.min(hi, series.n - 1) - lo + 1) }, (_, i) => lo + i), fields);
    },
    async at(seqs: readonly number[], fields: readonly SampleField[]) {
      src.calls++;
      return pick([...seqs], fields);
    },
  };
  return src;
}

/** One level's arrays, whole. */
export function level(blobs: SeriesBlob[], size: number, field: SeriesField | "_tFirst" | "_tLast" | "_seq" | "_gap") {
  const rows = blobs.filter((b) => b.kind === "level" && b.bucketSize === size && b.field === field).sort((a, b) => a.chunk - b.chunk);
  const bytes = rows.map((b) => new Uint8Array(b.data.buffer, b.data.byteOffset, b.data.byteLength));
  const type = field === "_tFirst" || field === "_tLast" ? "f64" : field === "_seq" ? "u32" : field === "_gap" ? "u8" : doubleFields.has(field) ? "f64" : "f32";
  return fromBytes(type, bytes);
}

/** Min and max of the finite values of a[lo, hi), and the index of the first occurrence of each. */
export function bruteMinMax(a: ArrayLike<number>, lo: number, hi: number) {
  let min = NaN, max = NaN, iMin = -1, iMax = -1;
  for (let i = lo; i < hi; i++) {
    const v = a[i];
    if (!Number.isFinite(v)) continue;
    if (iMin < 0 || v < min) (min = v), (iMin = i);
    if (iMax < 0 || v > max) (max = v), (iMax = i);
  }
  return { min, max, iMin, iMax };
}

/** A deterministic pseudo-random sequence in [0, 1) (mulberry32, common practice). */
export function rand(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
