import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

/** A per-machine session secret kept beside the local data, so sessions survive restarts. */
export function localSecret(dataDir: string): string {
  const file = path.join(dataDir, "nextauth-secret");
  if (fs.existsSync(file)) return fs.readFileSync(file, "utf8").trim();
  fs.mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString("base64url");
  fs.writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}
