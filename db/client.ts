import { drizzle, type MySql2Database } from "drizzle-orm/mysql2";
import mysql from "mysql2/promise";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Database = MySql2Database<typeof schema>;

// One pool per process; kept on globalThis so dev-mode reloads do not open a new pool each time.
const g = globalThis as unknown as { sortiePool?: mysql.Pool; sortieDb?: Database };

export function pool(): mysql.Pool {
  if (!g.sortiePool) {
    g.sortiePool = mysql.createPool({
      uri: env().DATABASE_URL,
      connectionLimit: env().DATABASE_POOL_SIZE,
      timezone: "Z",
      dateStrings: false,
      supportBigNumbers: true,
      // LOAD DATA LOCAL for bulk sample loading; the stream is supplied per query.
      flags: ["+LOCAL_FILES"],
      enableKeepAlive: true,
      connectTimeout: 5_000,
    });
  }
  return g.sortiePool;
}

export function db(): Database {
  if (!g.sortieDb) g.sortieDb = drizzle(pool(), { schema, mode: "default", casing: "snake_case" });
  return g.sortieDb;
}

export async function closeDb(): Promise<void> {
  const p = g.sortiePool;
  g.sortiePool = undefined;
  g.sortieDb = undefined;
  await p?.end();
}

export { schema };

/**
 * Runs `fn` in a transaction on one pooled connection (for raw statements such as
 * SELECT … FOR UPDATE SKIP LOCKED): committed when it returns, rolled back when it throws.
 */
export async function inConnectionTransaction<T>(fn: (conn: mysql.PoolConnection) => Promise<T>): Promise<T> {
  const conn = await pool().getConnection();
  try {
    await conn.beginTransaction();
    const out = await fn(conn);
    await conn.commit();
    return out;
  } catch (e) {
    await conn.rollback().catch(() => {});
    throw e;
  } finally {
    conn.release();
  }
}
