/**
 * `npm run worker`: the background worker without a web server — reads queued logs and sends
 * queued mail, sharing the queue in MariaDB with any app instances. Run app instances with
 * BACKGROUND_JOBS=off to leave all ingest to workers like this one.
 */
import { closeDb } from "@/db/client";
import { env } from "@/lib/env";
import { startWorker, stopWorker } from "@/lib/jobs/worker";
import { instanceId } from "@/lib/jobs/instance-id";

env();
startWorker();
console.log(`[worker] ${instanceId()} reading up to ${env().INGEST_PARALLEL} logs at a time; Ctrl-C stops after the logs in hand`);
// The worker's own timer is unref'd (so scripts can exit); this one keeps the process alive.
const keepAlive = setInterval(() => {}, 60_000);

let stopping = false;
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    if (stopping) return;
    stopping = true;
    console.log(`[worker] ${signal}: finishing the logs in hand…`);
    stopWorker()
      .then(() => closeDb())
      .finally(() => {
        clearInterval(keepAlive);
        process.exit(0);
      });
  });
}
