/**
 * `npm run bench:series [-- rows [repetitions]]` — chart reads of one ingested run (default
 * 1,000,000 rows, 20 repetitions, median and p95), each timed through the lib function the route
 * handler calls (access check, DB reads, decimation, JSON.stringify), beside baselines measured in
 * the same run on the same database: a `SELECT 1` round trip and reading the run row.
 * Target: the whole run at 2000 points ≤ 150 ms. Uses the test profile's ports with its own
 * throwaway data folder, so it must not run while `npm test` does.
 */
import { spawn } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { profile, projectRoot } from "../lib/profiles";
import { startStack } from "../lib/stack";
import { writeBenchCsv } from "./make-csv";

const ms = (t0: bigint) => Number(process.hrtime.bigint() - t0) / 1e6;

function stats(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)];
  const median = s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
  return { median, p95: q(0.95) };
}

async function timed(reps: number, f: () => Promise<unknown>): Promise<{ median: number; p95: number; bytes: number }> {
  let bytes = 0;
  await f(); // warm: statement caches, the buffer pool's pages
  const xs: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = process.hrtime.bigint();
    const out = await f();
    xs.push(ms(t0));
    if (typeof out === "number") bytes = out;
  }
  return { ...stats(xs), bytes };
}

async function main() {
  const rows = Number(process.argv[2] ?? 1_000_000);
  const reps = Number(process.argv[3] ?? 20);
  const p = { ...profile("test"), dataDir: path.join(projectRoot, ".data", "bench-series"), throwaway: true };
  const stack = await startStack(p);
  Object.assign(process.env, stack.env, { NEXTAUTH_SECRET: "bench-secret-bench-secret-0123456789" });
  try {
    const file = path.join(p.dataDir, "bench.csv");
    const bytes = await writeBenchCsv(file, rows);
    console.log(`generated ${rows.toLocaleString("en")} rows, ${(bytes / 1e6).toFixed(1)} MB`);

    const { runMigrations } = await import("@/db/migrate");
    const { pool, db, closeDb } = await import("@/db/client");
    const { uploads, runs } = await import("@/db/schema");
    const { getRun } = await import("@/db/queries/runs");
    const { getUserById } = await import("@/db/queries/users");
    const { signUp } = await import("@/lib/accounts/sign-up");
    const { Upload } = await import("@aws-sdk/lib-storage");
    const { s3, bucket } = await import("@/lib/storage/s3");
    const { getRunSeries, getRunTrack, getRunPoints } = await import("@/lib/series/read-series");
    await runMigrations();

    const { userId, crewId } = await signUp({ name: "Bench lead", email: "bench@crew.example", password: "bench bench bench", crewName: "bench" });
    const actor = { user: (await getUserById(userId))!, via: "session" as const };
    const key = "bench/series.csv";
    await new Upload({ client: s3(), params: { Bucket: bucket(), Key: key, Body: fs.createReadStream(file), ContentType: "text/csv" } }).done();
    const [{ id: uploadId }] = await db().insert(uploads).values({ crewId, fileName: "series.csv", sizeBytes: bytes, contentType: "text/csv", objectKey: key, status: "stored", storedAt: new Date() }).$returningId();
    const [{ id: runId }] = await db().insert(runs).values({ crewId, uploadId, title: "bench series" }).$returningId();

    // Ingest in a child process, as bench:ingest does, for its time and peak RSS with the levels.
    const child = spawn(path.join(projectRoot, "node_modules", ".bin", "tsx"), ["scripts/bench/ingest-child.ts", String(runId)], { cwd: projectRoot, env: process.env, stdio: ["ignore", "pipe", "inherit"] });
    let out = "";
    child.stdout.on("data", (d) => (out += d));
    await new Promise((r) => child.on("exit", r));
    const ing = JSON.parse(out.trim().split("\n").pop()!) as { seconds: number; status: string; error: string | null; samples: number; peakRssMb: number };
    if (ing.status !== "ready" || ing.samples !== rows) throw new Error(`ingest ended ${ing.status} with ${ing.samples} samples: ${ing.error}`);
    const [[lv]] = (await pool().query("SELECT COUNT(*) AS n, SUM(LENGTH(data)) AS b FROM series_levels WHERE run_id = ?", [runId])) as unknown as [{ n: number; b: number }[]];
    console.log(`ingest (parse, store, analyse, levels)  ${ing.seconds.toFixed(2)} s, peak RSS ${ing.peakRssMb.toFixed(0)} MB; levels: ${lv.n} rows, ${(Number(lv.b) / 1e6).toFixed(1)} MB`);

    const send = async <T>(c: Promise<{ body: T | null }>) => JSON.stringify((await c).body).length;
    const run = (await getRun(runId))!;
    const tEnd = run.durationS!;
    const fields = ["rssiDbm", "lqPct", "voltageV", "distanceFromHomeM"] as const;
    const series = (q: { from?: number; to?: number; points?: number; fields?: readonly (typeof fields)[number][] }) =>
      send(getRunSeries(actor, runId, { fields: [...(q.fields ?? fields)], from: q.from, to: q.to, points: q.points ?? 2000 }, null));

    const base1 = await timed(reps, () => pool().query("SELECT 1"));
    const base2 = await timed(reps, () => getRun(runId));
    const cases: [string, () => Promise<unknown>][] = [
      ["whole run, 4 fields, 2000 points", () => series({})],
      ["whole run, 1 field, 2000 points", () => series({ fields: ["rssiDbm"] })],
      ["whole run, 4 fields, 5000 points", () => series({ points: 5000 })],
      ["a tenth of the run, 2000 points", () => series({ from: tEnd * 0.45, to: tEnd * 0.55 })],
      ["10 minutes, 2000 points (raw, binned)", () => series({ from: tEnd / 2, to: tEnd / 2 + 600 })],
      ["10 seconds (raw)", () => series({ from: tEnd / 2, to: tEnd / 2 + 10 })],
      ["track", () => send(getRunTrack(actor, runId, {}, null))],
      ["points rssiDbm × distance, 2000", () => send(getRunPoints(actor, runId, { fields: ["rssiDbm", "distanceFromHomeM"], points: 2000 }, null))],
    ];
    console.log(`\nmedian and p95 of ${reps} repetitions (after one warm-up each), ms; ratio = median / median of the run-row read`);
    const line = (name: string, r: { median: number; p95: number; bytes: number }) =>
      console.log(`${name.padEnd(40)} ${r.median.toFixed(2).padStart(8)} ${r.p95.toFixed(2).padStart(8)}  ×${(r.median / base2.median).toFixed(1).padStart(5)}${r.bytes ? `  ${(r.bytes / 1024).toFixed(0)} KB JSON` : ""}`);
    line("baseline: SELECT 1", base1);
    line("baseline: read the run row (getRun)", base2);
    const results: Record<string, number> = {};
    for (const [name, f] of cases) {
      const r = await timed(reps, f);
      results[name] = r.median;
      line(name, r);
    }

    // A run stored before levels existed: the first read builds them from its samples.
    await pool().query("DELETE FROM series_levels WHERE run_id = ?", [runId]);
    const t0 = process.hrtime.bigint();
    await series({});
    console.log(`\nfirst read of a run without levels (rebuilt from its ${rows.toLocaleString("en")} samples and stored): ${(ms(t0) / 1000).toFixed(2)} s`);

    const whole = results["whole run, 4 fields, 2000 points"];
    console.log(`\nwhole run at 2000 points: median ${whole.toFixed(1)} ms (target ≤ 150 ms) — ${whole <= 150 ? "met" : "NOT met"}`);
    await closeDb();
  } finally {
    await stack.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
