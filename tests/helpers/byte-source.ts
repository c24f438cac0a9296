import { RC_CHANNELS, sampleFields, type ByteSource, type SampleBatch, type SampleField } from "@/lib/parsers/types";

/**
 * Feeds a string (UTF-8 encoded) or bytes as chunks of `size` bytes, so tests cross chunk
 * boundaries inside multi-byte characters, CRLF pairs and XML tags.
 */
export async function* byteChunks(input: string | Uint8Array, size = 7): ByteSource {
  const bytes = typeof input === "string" ? new TextEncoder().encode(input) : input;
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, Math.min(i + size, bytes.length));
}

/** Feeds a string as text chunks of `size` characters. */
export async function* textChunks(input: string, size = 7): ByteSource {
  for (let i = 0; i < input.length; i += size) yield input.slice(i, i + size);
}

/** A source that yields the given chunks as they are. */
export async function* chunksOf(...chunks: (string | Uint8Array)[]): ByteSource {
  for (const c of chunks) yield c;
}

/** Every batch a parser emitted, concatenated into plain arrays per field. */
export interface CollectedSamples {
  batches: number;
  length: number;
  columns: Record<SampleField, number[]>;
  segmentStart: number[];
  trackStart: number[];
  sourceLine: number[];
  rc: number[][] | null;
}

/**
 * A batch sink that copies each batch as it arrives (so nothing a parser does afterwards can change
 * what was seen) and concatenates them for assertions.
 */
export function collectSamples(): { onBatch: (b: SampleBatch) => void; samples: CollectedSamples } {
  const columns = {} as Record<SampleField, number[]>;
  for (const f of sampleFields) columns[f] = [];
  const samples: CollectedSamples = { batches: 0, length: 0, columns, segmentStart: [], trackStart: [], sourceLine: [], rc: null };
  const onBatch = (b: SampleBatch) => {
    samples.batches++;
    samples.length += b.length;
    for (const f of sampleFields) samples.columns[f].push(...Array.from(b.columns[f].subarray(0, b.length)));
    samples.segmentStart.push(...Array.from(b.segmentStart.subarray(0, b.length)));
    samples.trackStart.push(...Array.from(b.trackStart.subarray(0, b.length)));
    samples.sourceLine.push(...Array.from(b.sourceLine.subarray(0, b.length)));
    if (b.rc) {
      samples.rc ??= [];
      for (let i = 0; i < b.length; i++) samples.rc.push(Array.from(b.rc.subarray(i * RC_CHANNELS, (i + 1) * RC_CHANNELS)));
    }
  };
  return { onBatch, samples };
}
