/**
 * `npm run bench:ingest [-- rows]` — ingest throughput on one generated CSV (default 1,000,000 rows,
 * 15 columns), all three measured in the same run on the same data:
 *   (a) papaparse parsing alone; (b) MariaDB LOAD DATA LOCAL INFILE of the same CSV file into a
 *   15-column scratch table (MariaDB parsing the CSV itself); (b') LOAD DATA of the same rows as
 *   the samples table's own TSV into the samples table (the storage floor of the real table);
 *   (c) the full ingest: S3 object → parser → samples table, in a child process whose peak RSS
 *   is reported. Prints rows/s and the ratios (c)/(b) and (c)/(b').
 */
import { spawn } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { profile, projectRoot } from "../lib/profiles";
import { startStack } from "../lib/stack";
import { writeBenchCsv } from "./make-csv";

async function main() {
  const rows = Number(process.argv[2] ?? 1_000_000);
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
    // (b) LOAD DATA of the same file into a scratch table shaped like the CSV.
    await conn.query("CREATE TABLE IF NOT EXISTS bench_load (t DOUBLE, lat DOUBLE, lon DOUBLE, alt FLOAT, spd FLOAT, hdg FLOAT, sats TINYINT, hdop FLOAT, rssi FLOAT, lq FLOAT, snr FLOAT, v FLOAT, a FLOAT, mah FLOAT, mode VARCHAR(16), seq INT AUTO_INCREMENT PRIMARY KEY)");
    await conn.query("TRUNCATE bench_load");
    t = process.hrtime.bigint();
    await conn.beginTransaction();
    await conn.query({
      sql: "LOAD DATA LOCAL INFILE 'bench' INTO TABLE bench_load FIELDS TERMINATED BY ',' LINES TERMINATED BY '\\n' IGNORE 1 LINES (t, lat, lon, alt, spd, hdg, sats, hdop, rssi, lq, snr, v, a, mah, mode)",
      infileStreamFactory: () => fs.createReadStream(file),
    });
    await conn.commit();
    const b = Number(process.hrtime.bigint() - t) / 1e9;

    // (b') the same rows as the samples table's own TSV (what ingest streams), loaded alone.
    const { parseCsv } = await import("@/lib/parsers/csv");
    const { batchToTsv } = await import("@/lib/ingest/sample-tsv");
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
    t = process.hrtime.bigint();
    await conn.beginTransaction();
    await conn.query({
      sql:
        "LOAD DATA LOCAL INFILE 'bench-tsv' INTO TABLE samples FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' " +
        "(run_id, seq, t_s, lat, lon, alt_m, speed_mps, heading_deg, sats, hdop, fix_type, rssi_dbm, rssi_pct, lq_pct, snr_db, voltage_v, current_a, used_mah, mode_index, armed, failsafe, @rc) SET rc = UNHEX(NULLIF(@rc, ''))",
      infileStreamFactory: () => fs.createReadStream(tsvFile),
    });
    await conn.rollback();
    const b2 = Number(process.hrtime.bigint() - t) / 1e9;
    conn.release();

    // (c) the full pipeline from an S3 object, in a child process (its own peak RSS).
    const { crews, uploads, runs } = await import("@/db/schema");
    const key = "bench/bench.csv";
    const { Upload } = await import("@aws-sdk/lib-storage");
    const { s3, bucket } = await import("@/lib/storage/s3");
    await new Upload({ client: s3(), params: { Bucket: bucket(), Key: key, Body: fs.createReadStream(file), ContentType: "text/csv" } }).done();
    const [{ id: crewId }] = await db().insert(crews).values({ name: "bench" }).$returningId();
    const [{ id: uploadId }] = await db().insert(uploads).values({ crewId, fileName: "bench.csv", sizeBytes: bytes, contentType: "text/csv", objectKey: key, status: "stored", storedAt: new Date() }).$returningId();
    const [{ id: runId }] = await db().insert(runs).values({ crewId, uploadId, title: "bench" }).$returningId();
    await closeDb();
    const child = spawn(path.join(projectRoot, "node_modules", ".bin", "tsx"), ["scripts/bench/ingest-child.ts", String(runId)], { cwd: projectRoot, env: process.env, stdio: ["ignore", "pipe", "inherit"] });
    let out = "";
    child.stdout.on("data", (d) => (out += d));
    await new Promise((r) => child.on("exit", r));
    const c = JSON.parse(out.trim().split("\n").pop()!) as { seconds: number; status: string; error: string | null; samples: number; peakRssMb: number };
    if (c.status !== "ready" || c.samples !== rows) throw new Error(`ingest ended ${c.status} with ${c.samples} samples: ${c.error}`);

    const rate = (s: number) => `${Math.round(rows / s).toLocaleString("en")} rows/s`;
    console.log(`(a) papaparse parse alone        ${a.toFixed(2)} s  ${rate(a)}  (${parsed - 1} rows)`);
    console.log(`(b) LOAD DATA LOCAL INFILE        ${b.toFixed(2)} s  ${rate(b)}`);
    console.log(`(c) full ingest S3 → samples      ${c.seconds.toFixed(2)} s  ${rate(c.seconds)}`);
    console.log(`(b') LOAD DATA of ingest's own TSV into samples  ${b2.toFixed(2)} s  ${rate(b2)}`);
    console.log(`(c)/(b) throughput ratio          ${(b / c.seconds).toFixed(2)}  (target ≥ 0.5)`);
    console.log(`(c)/(b') throughput ratio         ${(b2 / c.seconds).toFixed(2)}`);
    console.log(`peak RSS of the ingest process    ${c.peakRssMb.toFixed(0)} MB  (target ≤ 400 MB)`);
  } finally {
    await stack.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
