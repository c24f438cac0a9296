/**
 * `npm start`: local services on loopback, migrations, demo seed, production build, serve.
 * `npm run dev` passes --dev and serves with `next dev` instead.
 */
import { buildApp, startApp, type AppServer } from "./lib/app-server";
import { mariadbShellCommand } from "./lib/mariadb";
import { profile } from "./lib/profiles";
import { localSecret } from "./lib/secret";
import { onShutdown, startStack, type Stack } from "./lib/stack";
import { log } from "./lib/util";

let stack: Stack | undefined;
let app: AppServer | undefined;

async function main() {
  const dev = process.argv.includes("--dev");
  const p = profile("dev");
  onShutdown(async () => {
    await app?.stop();
    await stack?.stop();
  });

  stack = await startStack(p);
  const env = { ...stack.env, NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? localSecret(p.dataDir) };
  Object.assign(process.env, env);

  const { runMigrations } = await import("@/db/migrate");
  const { seedDemo } = await import("@/db/seed-demo");
  const { closeDb } = await import("@/db/client");
  const { seedDemoRuns } = await import("./lib/seed-runs");
  await runMigrations();
  log("sortie", "database migrated");
  const seeded = await seedDemo();
  log("sortie", `demo crew ${seeded.created ? "created" : "already present"}`);
  const runsSeeded = await seedDemoRuns();
  log("sortie", `demo runs: ${runsSeeded.added} uploaded, ${runsSeeded.skipped} already there`);
  await closeDb();

  if (!dev) await buildApp(".next", env);
  app = await startApp({ port: p.appPort, distDir: ".next", env, mode: dev ? "dev" : "production" });

  const { demoCrew, demoPassword } = await import("@/db/demo-crew");
  const rule = "─".repeat(64);
  console.log(`\n${rule}\n  Sortie is running at ${app.url}\n`);
  console.log(`  Demo crew "${demoCrew.name}" — password for all: ${demoPassword}`);
  for (const m of demoCrew.members) console.log(`    ${m.role.padEnd(9)} ${m.email}`);
  console.log(`\n  Local inbox (invitations, resets): ${stack.env.SORTIE_INBOX_URL}`);
  console.log(`  Database shell: ${mariadbShellCommand(p)}`);
  console.log(`\n  Ctrl-C stops the app and the services.\n${rule}\n`);

  app.process.on("exit", async (code) => {
    log("app", `server exited (${code}); stopping services`);
    await stack?.stop();
    process.exit(code ?? 1);
  });
}

main().catch(async (e) => {
  console.error(`\n[sortie] could not start: ${(e as Error).message}`);
  await app?.stop();
  await stack?.stop();
  process.exit(1);
});
