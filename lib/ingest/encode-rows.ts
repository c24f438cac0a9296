/**
 * TSV encoding of sample rows for LOAD DATA. Self-contained on purpose: `tsv-worker.ts` ships this
 * function's source text to a worker thread, so it may use only its arguments and globals.
 *
 * Rows are `run_id, seq, <one cell per field>, rc_hex`; NaN/±Infinity become \N (NULL); kinds are
 * 0 = number, 1 = 0/1 flag, 2 = integer; RC channels travel as little-endian uint16 hex.
 */
export function encodeRows(
  runId: number,
  firstSeq: number,
  n: number,
  arrays: Float64Array[],
  kinds: number[],
  rc: Uint16Array | null,
  rcChannels: number,
): Uint8Array {
  const hex: string[] = [];
  for (let i = 0; i < 256; i++) hex.push((i < 16 ? "0" : "") + i.toString(16));
  const empty: boolean[] = [];
  for (let f = 0; f < arrays.length; f++) {
    let none = true;
    const arr = arrays[f];
    for (let i = 0; i < n && none; i++) if (arr[i] === arr[i]) none = false;
    empty.push(none);
  }
  const prefix = runId + "\t";
  const parts: string[] = new Array(n);
  for (let i = 0; i < n; i++) {
    let line = prefix + (firstSeq + i);
    for (let f = 0; f < arrays.length; f++) {
      if (empty[f]) {
        line += "\t\\N";
        continue;
      }
      const v = arrays[f][i];
      if (v !== v || v === Infinity || v === -Infinity) line += "\t\\N";
      else if (kinds[f] === 0) line += "\t" + v;
      else if (kinds[f] === 1) line += v ? "\t1" : "\t0";
      else line += "\t" + Math.round(v);
    }
    if (rc) {
      let s = "";
      let any = false;
      for (let c = 0; c < rcChannels; c++) {
        const us = rc[i * rcChannels + c];
        if (us) any = true;
        s += hex[us & 0xff] + hex[us >> 8];
      }
      line += any ? "\t" + s : "\t\\N";
    } else line += "\t\\N";
    parts[i] = line;
  }
  // Every cell is ASCII, so latin1 writes it byte for byte (faster than UTF-8). A fresh copy, not a
  // slice of Buffer's shared pool, so the worker can transfer it.
  const buf = Buffer.from(parts.join("\n") + "\n", "latin1");
  return new Uint8Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength));
}
