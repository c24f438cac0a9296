/**
 * Raw rows from the samples table: a seq range or a list of seqs for the readers, and a whole run
 * as a RunSeries for rebuilding levels of runs stored before they existed.
 */
import type { Pool, PoolConnection } from "mysql2/promise";
import type { RunSeries } from "@/lib/analysis/types";
import { sampleFields, type SampleField } from "@/lib/parsers/types";
import type { SampleRows, SampleSource } from "./read";

type Sql = Pick<Pool | PoolConnection, "query">;

/** The samples table's column of a field (snake_case, db/schema/runs.ts). Only names from sampleFields reach SQL. */
export const sampleColumn = (f: SampleField) => f.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);

function toRows(raw: unknown[][], fields: readonly SampleField[]): SampleRows {
  const n = raw.length;
  const seq = new Float64Array(n);
  const t = new Float64Array(n);
  const values: Partial<Record<SampleField, Float64Array>> = {};
  const cols = fields.map((f) => (values[f] = new Float64Array(n)));
  for (let i = 0; i < n; i++) {
    const r = raw[i];
    seq[i] = Number(r[0]);
    t[i] = Number(r[1]);
    for (let j = 0; j < cols.length; j++) {
      const v = r[j + 2];
      cols[j][i] = v === null ? NaN : Number(v);
    }
  }
  return { seq, t, values };
}

const selectList = (fields: readonly SampleField[]) => ["seq", "t_s", ...fields.map(sampleColumn)].join(", ");

function checkFields(fields: readonly SampleField[]) {
  for (const f of fields) if (!(sampleFields as readonly string[]).includes(f) || f === "tS") throw new Error(`not a sample value field: ${f}`);
}

export function dbSampleSource(conn: Sql, runId: number): SampleSource {
  return {
    async range(lo, hi, fields) {
      checkFields(fields);
      const [rows] = await conn.query({
        sql: `SELECT ${selectList(fields)} FROM samples WHERE run_id = ? AND seq BETWEEN ? AND ? ORDER BY seq`,
        values: [runId, lo, hi],
        rowsAsArray: true,
      });
      return toRows(rows as unknown[][], fields);
    },
    async at(seqs, fields) {
      checkFields(fields);
      if (!seqs.length) return toRows([], fields);
      const [rows] = await conn.query({
        sql: `SELECT ${selectList(fields)} FROM samples WHERE run_id = ? AND seq IN (?) ORDER BY seq`,
        values: [runId, seqs],
        rowsAsArray: true,
      });
      return toRows(rows as unknown[][], fields);
    },
  };
}

const PAGE = 50_000;
const doubles = new Set<SampleField>(["tS", "lat", "lon"]);

/**
 * A stored run as a RunSeries, read in pages of seq. Segment starts are not stored, so only the
 * first sample starts one (time gaps still break the levels); no RC channels.
 */
export async function loadStoredSeries(conn: Sql, runId: number, modeNames: string[]): Promise<RunSeries> {
  const [[{ n }]] = (await conn.query("SELECT COALESCE(MAX(seq) + 1, 0) AS n FROM samples WHERE run_id = ?", [runId])) as unknown as [{ n: number }[]];
  const len = Number(n);
  const cols = {} as Record<SampleField, Float64Array | Float32Array>;
  for (const f of sampleFields) cols[f] = (doubles.has(f) ? new Float64Array(len) : new Float32Array(len)).fill(NaN);
  const valueFields = sampleFields.filter((f) => f !== "tS");
  for (let lo = 0; lo < len; lo += PAGE) {
    const [rows] = await conn.query({
      sql: `SELECT ${selectList(valueFields)} FROM samples WHERE run_id = ? AND seq >= ? AND seq < ? ORDER BY seq`,
      values: [runId, lo, lo + PAGE],
      rowsAsArray: true,
    });
    for (const r of rows as unknown[][]) {
      const s = Number(r[0]);
      cols.tS[s] = Number(r[1]);
      for (let j = 0; j < valueFields.length; j++) {
        const v = r[j + 2];
        if (v !== null) cols[valueFields[j]][s] = Number(v);
      }
    }
  }
  const segmentStart = new Uint8Array(len);
  if (len) segmentStart[0] = 1;
  // A seq never written (not expected) reads as time 0 otherwise: carry the time before it.
  for (let i = 1; i < len; i++) if (cols.tS[i] !== cols.tS[i]) cols.tS[i] = cols.tS[i - 1];
  if (len && cols.tS[0] !== cols.tS[0]) cols.tS[0] = 0;
  return { n: len, ...cols, rc: null, segmentStart, modeNames };
}
