/**
 * `npm run bench:debrief [-- samples [repetitions]]` — time from navigation to the first chart
 * painted on the debrief page, in headless Chromium, for a run of 1,000,000 samples (default)
 * beside a 10,000-sample run measured in the same session as the baseline. Each page load reads
 * `performance.mark("sortie:first-chart")`, which the chart group sets when its first panel has
 * drawn real data. Uses the test profile's ports with a throwaway data directory: do not run it
 * while `npm test` runs. Prints medians, the ratio, and the target (≤ 1.5 s for the big run).
 */
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { buildApp, startApp } from "../lib/app-server";
import { profile, projectRoot } from "../lib/profiles";
import { startStack } from "../lib/stack";
import { writeBenchCsv } from "./make-csv";

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

async function main() {
  const big = Number(process.argv[2] ?? 1_000_000);
  const reps = Number(process.argv[3] ?? 5);
  const small = 10_000;
  const p = { ...profile("test"), dataDir: path.join(projectRoot, ".data", "bench"), throwaway: true };
  const stack = await startStack(p);
  const env: Record<string, string> = { ...stack.env, NEXTAUTH_SECRET: randomBytes(32).toString("base64url") };
  Object.assign(process.env, env);
  let app: Awaited<ReturnType<typeof startApp>> | null = null;
  try {
    const { runMigrations } = await import("@/db/migrate");
    const { seedDemo } = await import("@/db/seed-demo");
    const { db, closeDb } = await import("@/db/client");
    const { uploads, runs, crews } = await import("@/db/schema");
    const { eq } = await import("drizzle-orm");
    const { demoCrew, demoPassword } = await import("@/db/demo-crew");
    const { ingestRun } = await import("@/lib/ingest/ingest-run");
    const { Upload } = await import("@aws-sdk/lib-storage");
    const { s3, bucket } = await import("@/lib/storage/s3");
    await runMigrations();
    await seedDemo();
    const [crew] = await db().select().from(crews).where(eq(crews.name, demoCrew.name)).limit(1);

    // Both runs go through the real pipeline: S3 object → parse → samples, events and display levels.
    const makeRun = async (rows: number) => {
      const file = path.join(p.dataDir, `debrief-${rows}.csv`);
      const bytes = await writeBenchCsv(file, rows);
      const key = `bench/debrief-${rows}.csv`;
      await new Upload({ client: s3(), params: { Bucket: bucket(), Key: key, Body: fs.createReadStream(file), ContentType: "text/csv" } }).done();
      const [{ id: uploadId }] = await db().insert(uploads).values({ crewId: crew.id, fileName: `bench-${rows}.csv`, sizeBytes: bytes, contentType: "text/csv", objectKey: key, status: "stored", storedAt: new Date() }).$returningId();
      const [{ id: runId }] = await db().insert(runs).values({ crewId: crew.id, uploadId, title: `bench ${rows.toLocaleString("en")} samples` }).$returningId();
      await ingestRun(runId);
      const [row] = await db().select().from(runs).where(eq(runs.id, runId));
      if (row.status !== "ready") throw new Error(`bench run ${rows} ended ${row.status}: ${row.error}`);
      console.log(`ingested ${rows.toLocaleString("en")} samples as run ${runId}`);
      return runId;
    };
    const smallRun = await makeRun(small);
    const bigRun = await makeRun(big);
    await closeDb();

    await buildApp(".next-test", env);
    app = await startApp({ port: p.appPort, distDir: ".next-test", env, mode: "production", quiet: true });

    const { chromium } = await import("playwright-core");
    const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: ["--no-sandbox", "--disable-gpu"] });
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await ctx.newPage();
    const lead = demoCrew.members.find((m) => m.role === "lead")!;
    await page.goto(`${app.url}/sign-in`);
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/dashboard|runs/);

    const firstChartMs = async (runId: number) => {
      await page.goto(`${app!.url}/runs/${runId}`);
      const handle = await page.waitForFunction(() => performance.getEntriesByName("sortie:first-chart")[0]?.startTime, null, { timeout: 60_000 });
      return (await handle.jsonValue()) as number;
    };
    // One warm-up load of each (server caches, code in the browser cache), then alternate.
    await firstChartMs(smallRun);
    await firstChartMs(bigRun);
    const smallMs: number[] = [];
    const bigMs: number[] = [];
    for (let i = 0; i < reps; i++) {
      smallMs.push(await firstChartMs(smallRun));
      bigMs.push(await firstChartMs(bigRun));
    }
    await browser.close();
    const s = median(smallMs);
    const b = median(bigMs);
    console.log(`first chart painted after navigation, median of ${reps}:`);
    console.log(`  ${small.toLocaleString("en")} samples   ${s.toFixed(0)} ms  (baseline)   [${smallMs.map((v) => v.toFixed(0)).join(", ")}]`);
    console.log(`  ${big.toLocaleString("en")} samples ${b.toFixed(0)} ms  ratio ${(b / s).toFixed(2)}   [${bigMs.map((v) => v.toFixed(0)).join(", ")}]`);
    console.log(`  target ≤ 1500 ms for the big run: ${b <= 1500 ? "met" : "NOT met"}`);
  } finally {
    await app?.stop();
    await stack.stop();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
