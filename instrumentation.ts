/** Runs once when the server starts: refuse to serve with invalid settings, then tidy up. */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { env } = await import("./lib/env");
    env();
    const { recoverStaleRuns } = await import("./lib/ingest/recover-stale-runs");
    const n = await recoverStaleRuns().catch((e: Error) => {
      console.error(`[ingest] could not check for interrupted runs: ${e.message}`);
      return 0;
    });
    if (n) console.log(`[ingest] ${n} run(s) interrupted by the last shutdown marked failed (re-parse them)`);
  }
}
