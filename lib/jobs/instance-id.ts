import { randomBytes } from "node:crypto";
import { hostname } from "node:os";

const g = globalThis as unknown as { sortieInstanceId?: string };

/** Names this process in job claims: host and pid for people reading the table, a nonce so a reused pid never inherits a claim. */
export function instanceId(): string {
  return (g.sortieInstanceId ??= `${hostname().slice(0, 40)}:${process.pid}:${randomBytes(4).toString("hex")}`);
}
