/** Runs once when the server starts: refuse to serve with invalid settings, then start background work. */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { env } = await import("./lib/env");
    if (env().BACKGROUND_JOBS === "on") {
      const { startWorker } = await import("./lib/jobs/worker");
      startWorker();
    }
  }
}
