const codes = new Set([
  "ECONNREFUSED", "ECONNRESET", "PROTOCOL_CONNECTION_LOST", "ETIMEDOUT", "ER_CON_COUNT_ERROR", "EPIPE",
  // The server is shutting down or killed our connection; the host cannot be reached at all.
  "ER_SERVER_SHUTDOWN", "ER_CONNECTION_KILLED", "EHOSTUNREACH", "ENOTFOUND",
]);

/** True for connection-level failures of MariaDB (answered with 503), not for query errors. */
export function isDatabaseDown(e: unknown): boolean {
  for (let cur: unknown = e, depth = 0; cur && depth < 5; depth++) {
    const code = (cur as { code?: string }).code;
    if (code && codes.has(code)) return true;
    cur = (cur as { cause?: unknown }).cause;
  }
  return false;
}

/** The first driver error code in the chain (Drizzle wraps the driver's error in `cause`). */
export function errorCode(e: unknown): string | undefined {
  for (let cur: unknown = e, depth = 0; cur && depth < 5; depth++) {
    const code = (cur as { code?: string }).code;
    if (code) return code;
    cur = (cur as { cause?: unknown }).cause;
  }
  return undefined;
}
