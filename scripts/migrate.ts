import { closeDb } from "@/db/client";
import { runMigrations } from "@/db/migrate";

runMigrations()
  .then(() => console.log("[db] migrations applied"))
  .catch((e) => {
    console.error(`[db] migration failed: ${(e as Error).message}`);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
