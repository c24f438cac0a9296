/** Small helpers shared by the service scripts. */

const colours: Record<string, string> = {
  mariadb: "\x1b[36m",
  s3: "\x1b[35m",
  mail: "\x1b[33m",
  app: "\x1b[32m",
  sortie: "\x1b[1m",
};

export function log(source: string, message: string): void {
  const key = source.split(" ")[0];
  const c = process.stdout.isTTY ? (colours[key] ?? "") : "";
  const reset = c ? "\x1b[0m" : "";
  process.stdout.write(`${c}[${source}]${reset} ${message}\n`);
}

/** Polls `check` until it returns true; throws after `timeoutMs`. */
export async function waitFor(
  what: string,
  check: () => boolean | Promise<boolean>,
  timeoutMs: number,
  intervalMs = 200,
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    if (await check()) return;
    if (Date.now() > deadline) throw new Error(`Timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, intervalMs));
  }
}
