import { startMailCatcher } from "./mail-catcher";
import { startMariaDb, type RunningService } from "./mariadb";
import { startObjectStore } from "./object-store";
import { appEnv, type ServiceProfile } from "./profiles";
import fs from "node:fs";
import { log } from "./util";

export interface Stack {
  env: Record<string, string>;
  stop(): Promise<void>;
}

/** Starts MariaDB, the object store and the mail catcher for one profile; stops them in reverse. */
export async function startStack(p: ServiceProfile): Promise<Stack> {
  if (p.throwaway) fs.rmSync(p.dataDir, { recursive: true, force: true });
  fs.mkdirSync(p.dataDir, { recursive: true });
  const started: RunningService[] = [];
  const stop = async () => {
    for (const s of started.reverse()) {
      if (!s.owned) continue;
      try {
        await s.stop();
        log(s.name, "stopped");
      } catch (e) {
        log(s.name, `stop failed: ${(e as Error).message}`);
      }
    }
    started.length = 0;
  };
  try {
    started.push(await startMariaDb(p));
    started.push(await startObjectStore(p));
    started.push(await startMailCatcher(p));
  } catch (e) {
    await stop();
    throw e;
  }
  return { env: appEnv(p), stop };
}

/** Runs `cleanup` once on Ctrl-C / SIGTERM / normal exit paths. */
export function onShutdown(cleanup: () => Promise<void>): void {
  let done = false;
  const handler = (signal: NodeJS.Signals) => {
    if (done) return;
    done = true;
    log("sortie", `${signal}: stopping services…`);
    cleanup().finally(() => process.exit(signal === "SIGINT" ? 130 : 143));
  };
  process.on("SIGINT", handler);
  process.on("SIGTERM", handler);
}
