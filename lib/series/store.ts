/**
 * series_levels rows in and out. Writes go through the caller's connection (inside its
 * transaction); reads take a BlobSource so the readers work the same over rows built in memory.
 */
import type { Pool, PoolConnection } from "mysql2/promise";
import type { seriesBlobKinds } from "@/db/schema/series";
import { toBytes } from "./codec";
import type { BlobKind, SeriesBlob } from "./levels";

// The schema's enum and the builder's kinds must stay the same list.
type SameKinds = BlobKind extends (typeof seriesBlobKinds)[number] ? ((typeof seriesBlobKinds)[number] extends BlobKind ? true : never) : never;
const kindsMatch: SameKinds = true;
void kindsMatch;

/** Bytes per INSERT: a few rows of up to 256 KB each, well under MariaDB's 16 MB default packet. */
const INSERT_BYTES = 1 << 20;

type Sql = Pick<PoolConnection, "query" | "execute">;

export async function deleteSeriesLevels(conn: Sql, runId: number): Promise<void> {
  await conn.query("DELETE FROM series_levels WHERE run_id = ?", [runId]);
}

/**
 * Inserts the rows as the generator yields them (each one's memory can go before the next is
 * built), one statement in flight while the next batch is built: MariaDB stores while we compute.
 * @returns what the generator returned (the meta)
 */
export async function writeSeriesLevels<R>(conn: Sql, runId: number, blobs: Generator<SeriesBlob, R> | Iterable<SeriesBlob>): Promise<R | undefined> {
  let rows: (string | number | Buffer)[][] = [];
  let bytes = 0;
  let inFlight: Promise<unknown> = Promise.resolve();
  const flush = async () => {
    await inFlight;
    if (!rows.length) return;
    // Prepared, so the bytes go as binary rather than hex text (a few distinct row counts get cached).
    const sql = `INSERT INTO series_levels (run_id, kind, bucket_size, field, chunk, data) VALUES ${rows.map(() => "(?, ?, ?, ?, ?, ?)").join(", ")}`;
    inFlight = conn.execute(sql, rows.flat());
    // Observed here so a failure waits for the next await instead of going unhandled.
    inFlight.catch(() => {});
    rows = [];
    bytes = 0;
  };
  const it = blobs[Symbol.iterator]() as Iterator<SeriesBlob, R>;
  for (;;) {
    const r = it.next();
    if (r.done) {
      await flush();
      await inFlight;
      return r.value;
    }
    const b = r.value;
    // A view: the generator never changes an array it has yielded.
    const data = toBytes(b.data);
    rows.push([runId, b.kind, b.bucketSize, b.field, b.chunk, data]);
    bytes += data.byteLength;
    if (bytes >= INSERT_BYTES) await flush();
  }
}

export interface BlobQuery {
  kind: BlobKind;
  bucketSize: number;
  fields: readonly string[];
  /** Inclusive chunk range; all chunks when absent. */
  chunks?: [number, number];
}

export const blobKey = (kind: BlobKind, bucketSize: number, field: string) => `${kind}:${bucketSize}:${field}`;

/** Rows by blobKey, each a list of chunks in order. */
export type BlobRows = Map<string, Uint8Array[]>;

export interface BlobSource {
  read(queries: readonly BlobQuery[]): Promise<BlobRows>;
}

/** Reads from MariaDB in one statement per call. */
export function dbBlobSource(conn: Pick<Pool | PoolConnection, "query">, runId: number): BlobSource {
  return {
    async read(queries) {
      const where: string[] = [];
      const params: unknown[] = [runId];
      for (const q of queries) {
        if (!q.fields.length) continue;
        let clause = "(kind = ? AND bucket_size = ? AND field IN (?)";
        params.push(q.kind, q.bucketSize, q.fields);
        if (q.chunks) {
          clause += " AND chunk BETWEEN ? AND ?";
          params.push(q.chunks[0], q.chunks[1]);
        }
        where.push(clause + ")");
      }
      const out: BlobRows = new Map();
      if (!where.length) return out;
      const [rows] = (await conn.query(
        `SELECT kind, bucket_size, field, chunk, data FROM series_levels WHERE run_id = ? AND (${where.join(" OR ")}) ORDER BY kind, bucket_size, field, chunk`,
        params,
      )) as unknown as [{ kind: BlobKind; bucket_size: number; field: string; chunk: number; data: Buffer }[]];
      for (const r of rows) {
        const key = blobKey(r.kind, r.bucket_size, r.field);
        let list = out.get(key);
        if (!list) out.set(key, (list = []));
        list.push(r.data);
      }
      return out;
    },
  };
}

/** The same over rows held in memory (a rebuild in progress, tests). */
export function memoryBlobSource(blobs: Iterable<SeriesBlob>): BlobSource {
  const all = new Map<string, { chunk: number; data: Uint8Array }[]>();
  for (const b of blobs) {
    const key = blobKey(b.kind, b.bucketSize, b.field);
    let list = all.get(key);
    if (!list) all.set(key, (list = []));
    // Copied, as a stored row would be.
    list.push({ chunk: b.chunk, data: new Uint8Array(toBytes(b.data)) });
  }
  for (const list of all.values()) list.sort((a, b) => a.chunk - b.chunk);
  return {
    async read(queries) {
      const out: BlobRows = new Map();
      for (const q of queries) {
        for (const f of q.fields) {
          const key = blobKey(q.kind, q.bucketSize, f);
          const list = all.get(key);
          if (!list) continue;
          const picked = list.filter((c) => !q.chunks || (c.chunk >= q.chunks[0] && c.chunk <= q.chunks[1])).map((c) => c.data);
          if (picked.length) out.set(key, picked);
        }
      }
      return out;
    },
  };
}
