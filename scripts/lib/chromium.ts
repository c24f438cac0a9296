import { execFileSync } from "node:child_process";
import fs from "node:fs";
import { log } from "./util";

export const chromiumPath = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

/** Browser tests drive Debian's Chromium; install it once when it is missing. */
export function ensureChromium(): void {
  if (fs.existsSync(chromiumPath)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`Chromium not found at ${chromiumPath}. Run as root once: apt-get update && apt-get install -y chromium`);
  }
  log("sortie", "Chromium not found; installing Debian's chromium package (one time)…");
  execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit" });
  execFileSync("apt-get", ["install", "-y", "-qq", "chromium"], { stdio: "inherit", env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
}
