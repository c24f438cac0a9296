/**
 * `npm run bench:ingest [-- rows [repetitions]]` — ingest throughput on one generated CSV (default
 * 1,000,000 rows, 15 columns, 3 repetitions, medians reported), all measured in the same run on the
 * same data, each after InnoDB has settled:
 *   (a) papaparse parsing alone; (b) MariaDB LOAD DATA LOCAL INFILE of the same CSV file into a
 *   15-column scratch table (MariaDB parsing the CSV itself); (b') LOAD DATA of the same rows as
 *   the samples table's own TSV into the samples table (the storage floor of the real table);
 *   (c) the full ingest: S3 object → parser → samples table, in a child process whose peak RSS
 *   is reported. Prints rows/s and the ratios (c)/(b) and (c)/(b').
 */
import { spawn } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import type { PoolConnection } from "mysql2/promise";
import Papa from "papaparse";
import { profile, projectRoot } from "../lib/profiles";
import { startStack } from "../lib/stack";
import { writeBenchCsv } from "./make-csv";

function median(xs: number[]): number {
  const s = [...xs].sort((x, y) => x - y);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

/**
 * Waits until InnoDB has purged old row versions and stopped flushing pages, so no measurement
 * pays for the background work of the one before it (a rolled-back million-row load leaves a lot).
 */
async function settle(conn: PoolConnection): Promise<void> {
  const until = Date.now() + 60_000;
  let last = "";
  let prevDirty = -1;
  let still = 0;
  while (Date.now() < until) {
    const [rows] = (await conn.query(
      "SHOW GLOBAL STATUS WHERE Variable_name IN ('Innodb_history_list_length', 'Innodb_buffer_pool_pages_dirty')",
    )) as unknown as [{ Variable_name: string; Value: string }[]];
    const get = (n: string) => Number(rows.find((r) => r.Variable_name === n)?.Value ?? NaN);
    const history = get("Innodb_history_list_length"), dirty = get("Innodb_buffer_pool_pages_dirty");
    // Dirty pages are flushed lazily; once their count stops moving nothing runs in the background.
    still = dirty === prevDirty ? still + 1 : 0;
    prevDirty = dirty;
    if (history < 50 && (dirty < 200 || still >= 4)) return;
    last = `history ${history}, dirty pages ${dirty}`;
    await new Promise((r) => setTimeout(r, 250));
  }
  console.warn(`  (InnoDB did not settle within 60 s: ${last}; measuring anyway)`);
}

async function main() {
  const rows = Number(process.argv[2] ?? 1_000_000);
  const reps = Number(process.argv[3] ?? 3);
  const p = { ...profile("test"), dataDir: path.join(projectRoot, ".data", "bench"), throwaway: true };
  const stack = await startStack(p);
  Object.assign(process.env, stack.env, { NEXTAUTH_SECRET: "bench-secret-bench-secret-0123456789" });
  try {
    const file = path.join(p.dataDir, "bench.csv");
    const bytes = await writeBenchCsv(file, rows);
    console.log(`generated ${rows.toLocaleString("en")} rows, ${(bytes / 1e6).toFixed(1)} MB`);

    // (a) papaparse alone, streamed from disk.
    let t = process.hrtime.bigint();
    let parsed = 0;
    await new Promise<void>((resolve, reject) => {
      Papa.parse(fs.createReadStream(file), { header: false, step: () => void parsed++, complete: () => resolve(), error: reject } as never);
    });
    const a = Number(process.hrtime.bigint() - t) / 1e9;

    const { runMigrations } = await import("@/db/migrate");
    const { pool, db, closeDb } = await import("@/db/client");
    await runMigrations();
    const conn = await pool().getConnection();
    await conn.query("CREATE TABLE IF NOT EXISTS bench_load (t DOUBLE, lat DOUBLE, lon DOUBLE, alt FLOAT, spd FLOAT, hdg FLOAT, sats TINYINT, hdop FLOAT, rssi FLOAT, lq FLOAT, snr FLOAT, v FLOAT, a FLOAT, mah FLOAT, mode VARCHAR(16), seq INT AUTO_INCREMENT PRIMARY KEY)");

    // (b') needs the rows as ingest's own TSV, written once from the same CSV.
    const { parseCsv } = await import("@/lib/parsers/csv");
    const { batchToTsv } = await import("@/lib/ingest/sample-tsv");
    const { loadSamplesSql } = await import("@/lib/ingest/load-samples");
    const tsvFile = path.join(p.dataDir, "bench.tsv");
    const tsvOut = fs.createWriteStream(tsvFile);
    let seq = 0;
    await parseCsv(fs.createReadStream(file), {
      onBatch: (batch) => {
        tsvOut.write(batchToTsv(999_999, seq, batch));
        seq += batch.length;
      },
    });
    await new Promise((r) => tsvOut.end(r));

    /** One LOAD DATA in a transaction that is rolled back, so every repetition starts from the same table. */
    const timedLoad = async (sql: string, from: string) => {
      await settle(conn);
      const t0 = process.hrtime.bigint();
      await conn.beginTransaction();
      await conn.query({ sql, infileStreamFactory: () => fs.createReadStream(from) });
      const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
      await conn.rollback();
      return seconds;
    };
    // (b) MariaDB parsing the CSV itself into a table shaped like it.
    const csvLoadSql = "LOAD DATA LOCAL INFILE 'bench' INTO TABLE bench_load FIELDS TERMINATED BY ',' LINES TERMINATED BY '\\n' IGNORE 1 LINES (t, lat, lon, alt, spd, hdg, sats, hdop, rssi, lq, snr, v, a, mah, mode)";

    // (c) the full pipeline from an S3 object, each time a fresh run in a child process (its own peak RSS).
    const { crews, uploads, runs } = await import("@/db/schema");
    const { Upload } = await import("@aws-sdk/lib-storage");
    const { s3, bucket } = await import("@/lib/storage/s3");
    const [{ id: crewId }] = await db().insert(crews).values({ name: "bench" }).$returningId();
    const fullIngest = async (rep: number) => {
      const key = `bench/bench-${rep}.csv`;
      await new Upload({ client: s3(), params: { Bucket: bucket(), Key: key, Body: fs.createReadStream(file), ContentType: "text/csv" } }).done();
      const [{ id: uploadId }] = await db().insert(uploads).values({ crewId, fileName: `bench-${rep}.csv`, sizeBytes: bytes, contentType: "text/csv", objectKey: key, status: "stored", storedAt: new Date() }).$returningId();
      const [{ id: runId }] = await db().insert(runs).values({ crewId, uploadId, title: `bench ${rep}` }).$returningId();
      await settle(conn);
      const child = spawn(path.join(projectRoot, "node_modules", ".bin", "tsx"), ["scripts/bench/ingest-child.ts", String(runId)], { cwd: projectRoot, env: process.env, stdio: ["ignore", "pipe", "inherit"] });
      let out = "";
      child.stdout.on("data", (d) => (out += d));
      await new Promise((r) => child.on("exit", r));
      const c = JSON.parse(out.trim().split("\n").pop()!) as { seconds: number; status: string; error: string | null; samples: number; peakRssMb: number };
      if (c.status !== "ready" || c.samples !== rows) throw new Error(`ingest ended ${c.status} with ${c.samples} samples: ${c.error}`);
      // Keep the table as it was for the next repetition.
      await conn.query("DELETE FROM samples WHERE run_id = ?", [runId]);
      return c;
    };

    const bs: number[] = [], b2s: number[] = [], cs: number[] = [], rss: number[] = [];
    for (let rep = 0; rep < reps; rep++) {
      bs.push(await timedLoad(csvLoadSql, file));
      b2s.push(await timedLoad(loadSamplesSql(false), tsvFile));
      const c = await fullIngest(rep);
      cs.push(c.seconds);
      rss.push(c.peakRssMb);
      console.log(`  repetition ${rep + 1}: (b) ${bs[rep].toFixed(2)} s, (b') ${b2s[rep].toFixed(2)} s, (c) ${c.seconds.toFixed(2)} s, peak RSS ${c.peakRssMb.toFixed(0)} MB`);
    }
    conn.release();
    await closeDb();

    const b = median(bs), b2 = median(b2s), c = median(cs);
    const rate = (s: number) => `${Math.round(rows / s).toLocaleString("en")} rows/s`;
    console.log(`medians of ${reps} repetitions:`);
    console.log(`(a) papaparse parse alone        ${a.toFixed(2)} s  ${rate(a)}  (${parsed - 1} rows)`);
    console.log(`(b) LOAD DATA LOCAL INFILE        ${b.toFixed(2)} s  ${rate(b)}`);
    console.log(`(b') LOAD DATA of ingest's own TSV into samples  ${b2.toFixed(2)} s  ${rate(b2)}`);
    console.log(`(c) full ingest S3 → samples      ${c.toFixed(2)} s  ${rate(c)}  (parse, store and analyse, committed)`);
    console.log(`(c)/(b) throughput ratio          ${(b / c).toFixed(2)}  (target ≥ 0.5)`);
    console.log(`(c)/(b') throughput ratio         ${(b2 / c).toFixed(2)}`);
    console.log(`peak RSS of the ingest process    ${Math.max(...rss).toFixed(0)} MB, the highest of the repetitions  (target ≤ 400 MB)`);
  } finally {
    await stack.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
