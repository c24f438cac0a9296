/**
 * A private stack for the load and fault tests: its own MariaDB, object store and mail server
 * (profile "faults"), which a test may stop and start, and app instances served from the
 * production build that `npm test` (or `npm run soak`) made in .next-test/.
 * Everything listens on 127.0.0.1 only.
 */
import fs from "node:fs";
import path from "node:path";
import { closeDb } from "@/db/client";
import { benchCsvText } from "@/scripts/bench/make-csv";
import { runMigrations } from "@/db/migrate";
import { startApp, type AppServer } from "@/scripts/lib/app-server";
import { startMailCatcher } from "@/scripts/lib/mail-catcher";
import { startMariaDb, type RunningService } from "@/scripts/lib/mariadb";
import { startObjectStore } from "@/scripts/lib/object-store";
import { appEnv, profile, projectRoot } from "@/scripts/lib/profiles";

export const faults = profile("faults");

/** Short form inside `npm test`; `npm run soak` sets SORTIE_SOAK=full for the long one. */
export const soak = process.env.SORTIE_SOAK === "full";
export const scale = soak
  ? { ingests: 20, rowsPerLog: 100_000, reads: 200, readRounds: 5, crashRows: 1_000_000, timeoutMs: 15 * 60_000 }
  : { ingests: 20, rowsPerLog: 3_000, reads: 200, readRounds: 1, crashRows: 400_000, timeoutMs: 4 * 60_000 };

/** Settings every instance of this stack shares (one secret: sessions made by one are valid on all). */
export const instanceEnv: Record<string, string> = {
  ...appEnv(faults),
  NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET!,
  // Dead readers are noticed quickly, and mail retries come fast, so the tests stay short.
  INGEST_STALE_AFTER_S: "3",
  MAIL_RETRY_BASE_S: "1",
  LOGIN_MAX_FAILURES: "4",
  // Not the main test run's small multipart threshold (inherited through the environment).
  UPLOAD_MULTIPART_BYTES: String(200 * 1024 * 1024),
};

type Service = "mariadb" | "s3" | "mail";

export class FaultStack {
  private services = new Map<Service, RunningService>();
  private apps = new Set<AppServer>();

  static async start(): Promise<FaultStack> {
    fs.rmSync(faults.dataDir, { recursive: true, force: true });
    fs.mkdirSync(faults.dataDir, { recursive: true });
    const s = new FaultStack();
    await s.startService("mariadb");
    await s.startService("s3");
    await s.startService("mail");
    await runMigrations();
    return s;
  }

  async startService(name: Service): Promise<void> {
    // This process's own pool may hold connections to a database that has since stopped.
    if (name === "mariadb") await closeDb();
    const start = { mariadb: startMariaDb, s3: startObjectStore, mail: startMailCatcher }[name];
    this.services.set(name, await start(faults));
  }

  async stopService(name: Service): Promise<void> {
    await this.services.get(name)?.stop();
    this.services.delete(name);
  }

  /** One app instance on `port`; `env` adds or overrides settings for it alone. */
  async app(port: number, env: Record<string, string> = {}): Promise<AppServer> {
    if (!fs.existsSync(path.join(projectRoot, ".next-test", "BUILD_ID"))) {
      throw new Error("no production build in .next-test/: run through `npm test` or `npm run soak`, which build it first");
    }
    const app = await startApp({ port, distDir: ".next-test", env: { ...instanceEnv, ...env }, mode: "production", quiet: true });
    this.apps.add(app);
    return app;
  }

  /** As a power cut would: no shutdown hooks, open transactions left to the database to undo. */
  kill(app: AppServer): Promise<void> {
    return new Promise((resolve) => {
      if (app.process.exitCode !== null || app.process.signalCode !== null) return resolve();
      app.process.once("exit", () => resolve());
      app.process.kill("SIGKILL");
      this.apps.delete(app);
    });
  }

  async stop(): Promise<void> {
    for (const app of this.apps) await app.stop();
    this.apps.clear();
    await closeDb();
    for (const name of ["mail", "s3", "mariadb"] as const) await this.stopService(name).catch(() => {});
  }
}

/** Writes a figure file next to the vitest reports, for the closing summary of `npm test` / `npm run soak`. */
export function report(name: string, figures: Record<string, unknown>): void {
  const dir = path.join(projectRoot, ".data", "test-reports");
  fs.mkdirSync(dir, { recursive: true });
  fs.writeFileSync(path.join(dir, `${name}.json`), JSON.stringify({ soak, ...figures }, null, 2));
  console.log(`[${name}] ${JSON.stringify(figures)}`);
}

/**
 * Builds a test log without starving this process's sockets: generating a large one blocks the
 * event loop for seconds, long enough for the app to close idle keep-alive connections, and a
 * request sent before the loop has seen those closes fails with "other side closed".
 */
export async function makeLog(rows: number, seed: number): Promise<string> {
  const body = benchCsvText(rows, seed);
  await new Promise((r) => setTimeout(r, 20));
  return body;
}

export async function waitUntil<T>(what: string, f: () => Promise<T | null | undefined | false>, timeoutMs: number, everyMs = 100): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await f().catch(() => null);
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
