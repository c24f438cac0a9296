import path from "node:path";
import { migrate } from "drizzle-orm/mysql2/migrator";
import { db } from "./client";

/** Applies committed drizzle-kit migrations; safe to run on every start. */
export async function runMigrations(): Promise<void> {
  await migrate(db(), { migrationsFolder: path.join(process.cwd(), "db", "migrations") });
}
