/**
 * `npm run services [-- test]`: only the local services (MariaDB, S3, SMTP) for a profile,
 * until Ctrl-C. Handy for `npm run dev`-style work or poking at the database.
 */
import { mariadbShellCommand } from "./lib/mariadb";
import { profile } from "./lib/profiles";
import { onShutdown, startStack } from "./lib/stack";

async function main() {
  const p = profile(process.argv[2] === "test" ? "test" : "dev");
  const stack = await startStack({ ...p, throwaway: false });
  onShutdown(() => stack.stop());
  for (const [k, v] of Object.entries(stack.env)) console.log(`${k}=${v}`);
  console.log(`\nDatabase shell: ${mariadbShellCommand(p)}\nCtrl-C stops the services.`);
  setInterval(() => {}, 1 << 30);
}

main().catch((e) => {
  console.error(`[sortie] ${(e as Error).message}`);
  process.exit(1);
});
