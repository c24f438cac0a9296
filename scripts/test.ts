/**
 * `npm test`: throwaway MariaDB / S3 / SMTP on test ports, migrations, unit tests, a production
 * build served on its own port, then integration and browser tests against it, then the load and
 * fault tests (tests/faults) on a stack of their own, in their short form.
 * Extra arguments go to vitest (e.g. `npm test -- tests/unit/auth`).
 */
import { randomBytes } from "node:crypto";
import { buildApp, startApp, type AppServer } from "./lib/app-server";
import { ensureChromium } from "./lib/chromium";
import { profile, projectRoot } from "./lib/profiles";
import { onShutdown, startStack, type Stack } from "./lib/stack";
import { log } from "./lib/util";
import { clearFigures, printFigures, vitest, type VitestJson } from "./lib/vitest-run";

let stack: Stack | undefined;
let app: AppServer | undefined;

async function main(): Promise<number> {
  const t0 = Date.now();
  const extra = process.argv.slice(2);
  const p = profile("test");
  onShutdown(async () => {
    await app?.stop();
    await stack?.stop();
  });
  ensureChromium();
  stack = await startStack(p);
  const env: Record<string, string> = {
    ...stack.env,
    NEXTAUTH_SECRET: randomBytes(32).toString("base64url"),
    SORTIE_TEST_APP_URL: `http://localhost:${p.appPort}`,
    // Tests sign in many times from one address; keep the limiter but give it room.
    LOGIN_MAX_FAILURES: "8",
    // Exercise multipart uploads with small files.
    UPLOAD_MULTIPART_BYTES: String(8 * 1024 * 1024),
    UPLOAD_PART_BYTES: String(5 * 1024 * 1024),
  };
  Object.assign(process.env, env);
  const { runMigrations } = await import("@/db/migrate");
  const { seedDemo } = await import("@/db/seed-demo");
  const { closeDb } = await import("@/db/client");
  const { seedDemoRuns } = await import("./lib/seed-runs");
  await runMigrations();
  await seedDemo();
  const runsSeeded = await seedDemoRuns();
  await closeDb();
  log("sortie", `demo runs uploaded through the pipeline: ${runsSeeded.added}`);
  log("sortie", "test database migrated and seeded");

  const results: VitestJson[] = [];
  results.push(await vitest(["unit"], env, extra));

  await buildApp(".next-test", env);
  app = await startApp({ port: p.appPort, distDir: ".next-test", env, mode: "production", quiet: true });
  log("app", `test server at ${app.url}`);
  results.push(await vitest(["integration", "e2e"], env, extra));

  await app.stop();
  app = undefined;
  await stack.stop();
  stack = undefined;

  // Load and fault tests bring up (and knock down) their own stack: alone, after the rest.
  clearFigures();
  results.push(await vitest(["faults"], { NEXT_TELEMETRY_DISABLED: "1" }, extra));
  printFigures();

  const passed = results.reduce((n, r) => n + r.numPassedTests, 0);
  const failed = results.reduce((n, r) => n + r.numFailedTests, 0);
  const skipped = results.reduce((n, r) => n + r.numPendingTests + r.numTodoTests, 0);
  const ok = results.every((r) => r.success) && failed === 0 && passed > 0;
  log("sortie", `finished in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
  console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
  return ok ? 0 : 1;
}

main()
  .then((code) => process.exit(code))
  .catch(async (e) => {
    console.error(`\n[sortie] test run aborted: ${(e as Error).stack ?? e}`);
    await app?.stop();
    await stack?.stop();
    console.log("0 passed, 1 failed");
    process.exit(1);
  });
