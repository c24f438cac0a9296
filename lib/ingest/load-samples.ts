import { once } from "node:events";
import { PassThrough } from "node:stream";
import type { PoolConnection } from "mysql2/promise";
import type { SampleBatch } from "@/lib/parsers/types";
import { TsvEncoder } from "./tsv-worker";

// snake_case names of the samples table, in TSV_FIELDS order (db/schema/runs.ts).
const LOAD_COLUMNS = [
  "t_s", "lat", "lon", "alt_m", "speed_mps", "heading_deg", "sats", "hdop", "fix_type", "rssi_dbm", "rssi_pct",
  "lq_pct", "snr_db", "voltage_v", "current_a", "used_mah", "mode_index", "armed", "failsafe",
];

/**
 * The LOAD DATA statement for ingest's TSV. Without RC channels the rc column is left out: the
 * per-row user variable and UNHEX would otherwise cost MariaDB about a third of its load time.
 */
export function loadSamplesSql(withRc: boolean): string {
  const head =
    "LOAD DATA LOCAL INFILE 'sortie-samples' INTO TABLE samples CHARACTER SET utf8mb4 " +
    "FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' ";
  return withRc
    ? `${head}(run_id, seq, ${LOAD_COLUMNS.join(", ")}, @rc) SET rc = UNHEX(NULLIF(@rc, ''))`
    : `${head}(run_id, seq, ${LOAD_COLUMNS.join(", ")})`;
}

/**
 * Streams samples into MariaDB with one LOAD DATA LOCAL INFILE on `conn` (inside the caller's
 * transaction): ~2× the rate of batched INSERTs and no SQL text per row. Returns a sink for
 * the parser and a `finish()` that ends the stream and waits for the statement. A file holding
 * several runs loads them one after another on the same connection, passing one `encoder` (its
 * worker thread is then the caller's to close).
 */
export function startSampleLoad(conn: PoolConnection, runId: number, shared?: TsvEncoder) {
  const stream = new PassThrough({ highWaterMark: 4 * 1024 * 1024 });
  let seq = 0;
  // Started with the first batch, which tells whether the log has RC channels (a parser's
  // batches either all carry them or none do).
  let withRc: boolean | null = null;
  let done: Promise<number> = Promise.resolve(0);
  const start = (rc: boolean) => {
    withRc = rc;
    done = conn.query({ sql: loadSamplesSql(rc), infileStreamFactory: () => stream }).then(([r]) => (r as { affectedRows: number }).affectedRows);
    // Keep the rejection observed even if the parser fails first; finish() re-throws it.
    done.catch(() => {});
  };
  const encoder = shared ?? new TsvEncoder(runId);
  const closeEncoder = () => (shared ? Promise.resolve() : encoder.close());
  // Batches being encoded, oldest first; a few in flight keep both cores busy.
  const inFlight: Promise<Buffer>[] = [];
  const MAX_IN_FLIGHT = 3;
  const flushOne = async () => {
    const buf = await inFlight.shift()!;
    if (!stream.write(buf)) await Promise.race([once(stream, "drain"), done.then(() => {})]);
  };

  return {
    async write(batch: SampleBatch): Promise<void> {
      if (withRc === null) start(batch.rc !== null);
      else if (withRc !== (batch.rc !== null)) throw new Error("a log's batches must all carry RC channels or none");
      const p = encoder.encode(seq, batch, runId);
      p.catch(() => {});
      inFlight.push(p);
      seq += batch.length;
      while (inFlight.length >= MAX_IN_FLIGHT) await flushOne();
    },
    async finish(): Promise<number> {
      try {
        while (inFlight.length) await flushOne();
      } finally {
        await closeEncoder();
      }
      stream.end();
      return withRc === null ? 0 : done;
    },
    /**
     * Ends the stream cleanly and waits for the statement: destroying it instead leaves mysql2's
     * LOAD DATA waiting for bytes that never come. The caller rolls the rows back.
     */
    async abort(): Promise<void> {
      inFlight.length = 0;
      await closeEncoder();
      if (!stream.writableEnded) stream.end();
      await done.catch(() => {});
    },
    get written() {
      return seq;
    },
  };
}
