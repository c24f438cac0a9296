import { RC_CHANNELS, sampleFields, type SampleBatch } from "@/lib/parsers/types";
import { encodeRows } from "./encode-rows";

/**
 * Column order of the TSV stream fed to LOAD DATA; must match LOAD_COLUMNS in load-samples.ts.
 * NaN becomes \N (NULL). RC channels travel as hex (72 characters) and are UNHEXed by MariaDB.
 */
export const TSV_FIELDS = sampleFields;

// 0 = plain number, 1 = 0/1 flag, 2 = integer.
const kinds = TSV_FIELDS.map((f) => (f === "armed" || f === "failsafe" ? 1 : f === "sats" || f === "fixType" || f === "modeIndex" ? 2 : 0));

/** Kind of each TSV field for encodeRows: 0 = number, 1 = 0/1 flag, 2 = integer. */
export const TSV_KINDS = kinds;

/** The columns of a batch in TSV order. */
export function batchArrays(batch: SampleBatch): Float64Array[] {
  return TSV_FIELDS.map((f) => batch.columns[f]);
}

/**
 * Encodes one batch as TSV rows `run_id, seq, <fields…>, rc_hex`, starting at sequence `firstSeq`
 * (on this thread; ingest runs the same encoder on a worker thread, see tsv-worker.ts).
 * @example batchToTsv(7, 0, batch) // → Buffer("7\t0\t0\t53.47\t-3.05\t…\n…")
 */
export function batchToTsv(runId: number, firstSeq: number, batch: SampleBatch): Buffer {
  const bytes = encodeRows(runId, firstSeq, batch.length, batchArrays(batch), kinds, batch.rc, RC_CHANNELS);
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}

/** Decodes the packed RC column read back from MariaDB into 18 µs values (0 = absent). */
export function decodeRc(buf: Buffer | Uint8Array | null): number[] | null {
  if (!buf) return null;
  const out: number[] = [];
  for (let c = 0; c < RC_CHANNELS; c++) out.push(buf[c * 2] | (buf[c * 2 + 1] << 8));
  return out;
}
