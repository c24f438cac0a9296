import { spawn, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { projectRoot } from "./profiles";
import { log, waitFor } from "./util";

const nextBin = path.join(projectRoot, "node_modules", ".bin", "next");
const sourceDirs = ["app", "components", "config", "db", "lib", "public", "types"];
const sourceFiles = ["package-lock.json", "next.config.ts", "postcss.config.mjs", "tsconfig.json", "proxy.ts", "instrumentation.ts"];

function walk(dir: string, out: string[]): void {
  if (!fs.existsSync(dir)) return;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) walk(p, out);
    else out.push(p);
  }
}

/** A fingerprint of everything the production build depends on, to skip needless rebuilds. */
function sourceStamp(): string {
  const files: string[] = [];
  for (const d of sourceDirs) walk(path.join(projectRoot, d), files);
  for (const f of sourceFiles) files.push(path.join(projectRoot, f));
  const h = createHash("sha256");
  for (const f of files.sort()) {
    if (!fs.existsSync(f)) continue;
    const st = fs.statSync(f);
    h.update(`${path.relative(projectRoot, f)}:${st.size}:${st.mtimeMs}\n`);
  }
  return h.digest("hex");
}

/**
 * `next build` into `distDir` unless the same sources were built there already. Async, so the
 * object store and mail catcher served from this process keep answering meanwhile.
 */
export async function buildApp(distDir: string, env: Record<string, string>, opts: { force?: boolean } = {}): Promise<void> {
  const stampFile = path.join(projectRoot, distDir, "sortie-source-stamp");
  const stamp = sourceStamp();
  const built = fs.existsSync(path.join(projectRoot, distDir, "BUILD_ID"));
  if (!opts.force && built && fs.existsSync(stampFile) && fs.readFileSync(stampFile, "utf8") === stamp) {
    log("app", `production build in ${distDir}/ is current; skipping next build`);
    return;
  }
  log("app", `building the app (next build → ${distDir}/)…`);
  const t0 = Date.now();
  const child = spawn(nextBin, ["build"], {
    cwd: projectRoot,
    stdio: "inherit",
    env: { ...process.env, ...env, SORTIE_DIST_DIR: distDir, NODE_ENV: "production" },
  });
  const status = await new Promise<number>((resolve) => child.on("exit", (code) => resolve(code ?? 1)));
  if (status !== 0) throw new Error(`next build failed (exit ${status})`);
  fs.writeFileSync(stampFile, stamp);
  log("app", `built in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
}

export interface AppServer {
  url: string;
  process: ChildProcess;
  stop(): Promise<void>;
}

/** Starts `next start` (or `next dev`) and waits until /api/health answers 200. */
export async function startApp(opts: {
  port: number;
  distDir: string;
  env: Record<string, string>;
  mode: "production" | "dev";
  quiet?: boolean;
}): Promise<AppServer> {
  const args = opts.mode === "dev" ? ["dev", "-p", String(opts.port)] : ["start", "-p", String(opts.port)];
  const child = spawn(nextBin, args, {
    cwd: projectRoot,
    stdio: opts.quiet ? ["ignore", "pipe", "pipe"] : "inherit",
    env: { ...process.env, ...opts.env, SORTIE_DIST_DIR: opts.distDir, PORT: String(opts.port), NODE_ENV: opts.mode === "dev" ? "development" : "production" },
  });
  const lines: string[] = [];
  if (opts.quiet) {
    const keep = (b: Buffer) => {
      lines.push(...b.toString().split("\n"));
      if (lines.length > 400) lines.splice(0, lines.length - 400);
    };
    child.stdout?.on("data", keep);
    child.stderr?.on("data", keep);
  }
  let exited: number | null = null;
  child.on("exit", (code) => (exited = code ?? -1));
  const url = `http://localhost:${opts.port}`;
  try {
    await waitFor(
      "the app to answer /api/health",
      async () => {
        if (exited !== null) throw new Error(`app server exited with ${exited}\n${lines.slice(-40).join("\n")}`);
        try {
          const r = await fetch(`${url}/api/health`);
          return r.status === 200;
        } catch {
          return false;
        }
      },
      opts.mode === "dev" ? 180_000 : 60_000,
      300,
    );
  } catch (e) {
    child.kill("SIGTERM");
    throw e;
  }
  return {
    url,
    process: child,
    async stop() {
      if (exited !== null) return;
      child.kill("SIGTERM");
      await waitFor("app stop", () => exited !== null, 10_000).catch(() => child.kill("SIGKILL"));
    },
  };
}
