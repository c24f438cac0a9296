/** Child process of the ingest benchmark: ingests one prepared run and reports time and peak RSS. */
import { closeDb } from "@/db/client";
import { ingestRun } from "@/lib/ingest/ingest-run";
import { getRun } from "@/db/queries/runs";

async function main() {
  const runId = Number(process.argv[2]);
  const t0 = process.hrtime.bigint();
  await ingestRun(runId);
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  const run = await getRun(runId);
  await closeDb();
  // maxRSS is in kilobytes (Node docs, process.resourceUsage()).
  process.stdout.write(JSON.stringify({ seconds, status: run?.status, error: run?.error, samples: run?.sampleCount, peakRssMb: process.resourceUsage().maxRSS / 1024 }) + "\n");
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
