/** True for MariaDB's duplicate-key error, whether raw from mysql2 or wrapped by Drizzle. */
export function isDuplicateKey(e: unknown): boolean {
  for (let cur: unknown = e, depth = 0; cur && depth < 4; depth++) {
    if ((cur as { code?: string }).code === "ER_DUP_ENTRY") return true;
    cur = (cur as { cause?: unknown }).cause;
  }
  return false;
}
