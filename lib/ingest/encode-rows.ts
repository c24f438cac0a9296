/**
 * TSV encoding of sample rows for LOAD DATA. Self-contained on purpose: `tsv-worker.ts` ships this
 * function's source text to a worker thread, so it may use only its arguments and globals.
 *
 * Rows are `run_id, seq, <one cell per field>[, rc_hex]` (the RC cell only when `rc` is given);
 * NaN/±Infinity become \N (NULL); kinds are 0 = number, 1 = 0/1 flag, 2 = integer; RC channels
 * travel as little-endian uint16 hex. Bytes are written straight into one buffer: building a
 * string per row cost more than parsing the log did.
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
  const TAB = 9, NL = 10, MINUS = 45, DOT = 46, ZERO = 48, BACKSLASH = 92, N = 78;
  const HEX = [48, 49, 50, 51, 52, 53, 54, 55, 56, 57, 97, 98, 99, 100, 101, 102];
  const POW10: number[] = [];
  for (let k = 0, p = 1; k <= 9; k++, p *= 10) POW10.push(p);
  const MAX_EXACT = 9007199254740991;
  // 25 bytes is the longest cell: a tab and a 24-character number such as -1.2345678901234567e-300.
  const out = new Uint8Array(n * (String(runId).length + 12 + arrays.length * 25 + (rc ? 1 + rcChannels * 4 : 0) + 1));
  let p = 0;

  /** A non-negative integer below 2^53. */
  const writeInt = (m: number) => {
    let digits = 1;
    for (let t = m; t >= 10; t = Math.floor(t / 10)) digits++;
    let q = (p += digits);
    for (let x = m; digits-- > 0; ) {
      const r = x % 10;
      out[--q] = ZERO + r;
      x = (x - r) / 10;
    }
  };
  /** `m` with `d` digits after the point, zero-padded: writeFixed(5, 2) writes 0.05. */
  const writeFixed = (m: number, d: number) => {
    const frac = m % POW10[d];
    writeInt((m - frac) / POW10[d]);
    out[p++] = DOT;
    let q = (p += d);
    for (let x = frac, k = 0; k < d; k++) {
      const r = x % 10;
      out[--q] = ZERO + r;
      x = (x - r) / 10;
    }
  };
  /**
   * The shortest decimal with at most 9 places that reads back as exactly `v`: m / 10^d is one
   * correctly rounded IEEE division (Clinger's fast path, PLDI 1990), which is how MariaDB's
   * strtod reads such a decimal too. Anything else is written as JavaScript writes numbers.
   */
  const writeNumber = (v: number) => {
    let a = v;
    if (a < 0) {
      out[p++] = MINUS;
      a = -a;
    }
    if (a === 0) {
      out[p++] = ZERO;
      return;
    }
    for (let d = 0; d <= 9; d++) {
      const m = Math.round(a * POW10[d]);
      if (m > MAX_EXACT) break;
      if (m / POW10[d] === a) {
        if (d === 0) writeInt(m);
        else writeFixed(m, d);
        return;
      }
    }
    const s = String(a);
    for (let k = 0; k < s.length; k++) out[p++] = s.charCodeAt(k);
  };
  const writeNull = () => {
    out[p++] = TAB;
    out[p++] = BACKSLASH;
    out[p++] = N;
  };

  const empty: boolean[] = [];
  for (let f = 0; f < arrays.length; f++) {
    let none = true;
    const arr = arrays[f];
    for (let i = 0; i < n && none; i++) if (arr[i] === arr[i]) none = false;
    empty.push(none);
  }
  for (let i = 0; i < n; i++) {
    writeInt(runId);
    out[p++] = TAB;
    writeInt(firstSeq + i);
    for (let f = 0; f < arrays.length; f++) {
      if (empty[f]) {
        writeNull();
        continue;
      }
      const v = arrays[f][i];
      if (v - v !== 0) writeNull(); // NaN or ±Infinity
      else {
        out[p++] = TAB;
        if (kinds[f] === 1) out[p++] = v ? ZERO + 1 : ZERO;
        else writeNumber(kinds[f] === 2 ? Math.round(v) : v);
      }
    }
    if (rc) {
      let any = false;
      for (let c = 0; c < rcChannels && !any; c++) if (rc[i * rcChannels + c]) any = true;
      if (!any) writeNull();
      else {
        out[p++] = TAB;
        for (let c = 0; c < rcChannels; c++) {
          const us = rc[i * rcChannels + c];
          out[p++] = HEX[(us >> 4) & 15];
          out[p++] = HEX[us & 15];
          out[p++] = HEX[(us >> 12) & 15];
          out[p++] = HEX[(us >> 8) & 15];
        }
      }
    }
    out[p++] = NL;
  }
  // A copy of the used part: its buffer can be transferred from the worker and holds no slack.
  return out.slice(0, p);
}
