import { RC_CHANNELS, sampleFields, type SampleBatch } from "@/lib/parsers/types";

/**
 * Column order of the TSV stream fed to LOAD DATA; must match LOAD_COLUMNS in load-samples.ts.
 * NaN becomes \N (NULL). RC channels travel as hex (72 characters) and are UNHEXed by MariaDB.
 */
export const TSV_FIELDS = sampleFields;

const booleanFields = new Set(["armed", "failsafe"]);
const integerFields = new Set(["sats", "fixType", "modeIndex"]);

function cell(field: string, v: number): string {
  if (Number.isNaN(v) || !Number.isFinite(v)) return "\\N";
  if (booleanFields.has(field)) return v ? "1" : "0";
  if (integerFields.has(field)) return String(Math.round(v));
  return String(v);
}

const hex = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, "0"));

function rcHex(rc: Uint16Array, row: number): string {
  let s = "";
  let any = false;
  for (let c = 0; c < RC_CHANNELS; c++) {
    const v = rc[row * RC_CHANNELS + c];
    if (v) any = true;
    s += hex[v & 0xff] + hex[v >> 8]; // little-endian uint16
  }
  return any ? s : "\\N";
}

/**
 * Encodes one batch as TSV rows `run_id, seq, <fields…>, rc_hex`, starting at sequence `firstSeq`.
 * @example batchToTsv(7, 0, batch) // → Buffer("7\t0\t0\t53.47\t-3.05\t…\n…")
 */
export function batchToTsv(runId: number, firstSeq: number, batch: SampleBatch): Buffer {
  const lines: string[] = new Array(batch.length);
  const cols = TSV_FIELDS.map((f) => [f, batch.columns[f]] as const);
  for (let i = 0; i < batch.length; i++) {
    let line = `${runId}\t${firstSeq + i}`;
    for (const [f, arr] of cols) line += "\t" + cell(f, arr[i]);
    line += "\t" + (batch.rc ? rcHex(batch.rc, i) : "\\N");
    lines[i] = line;
  }
  return Buffer.from(lines.join("\n") + "\n", "utf8");
}

/** Decodes the packed RC column read back from MariaDB into 18 µs values (0 = absent). */
export function decodeRc(buf: Buffer | Uint8Array | null): number[] | null {
  if (!buf) return null;
  const out: number[] = [];
  for (let c = 0; c < RC_CHANNELS; c++) out.push(buf[c * 2] | (buf[c * 2 + 1] << 8));
  return out;
}
