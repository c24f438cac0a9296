/** Runs once when the server starts: refuse to serve with invalid settings, then start background work. */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { env } = await import("./lib/env");
    if (env().BACKGROUND_JOBS === "on") {
      const { handBackForShutdown, startWorker } = await import("./lib/jobs/worker");
      startWorker();
      // Next closes the server and exits on these; the logs in hand go back to the queue first.
      for (const signal of ["SIGTERM", "SIGINT"] as const) process.once(signal, () => void handBackForShutdown());
    }
  }
}
