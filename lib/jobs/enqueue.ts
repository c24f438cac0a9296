import { enqueueIngestJob } from "./ingest-jobs";
import { pokeWorker } from "./worker";

/** Queues a run for reading: durably in MariaDB, then nudges this process's worker (if it runs one). */
export async function enqueueIngest(runId: number): Promise<void> {
  await enqueueIngestJob(runId);
  pokeWorker();
}
