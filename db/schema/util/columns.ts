import { sql } from "drizzle-orm";
import { bigint, datetime } from "drizzle-orm/mysql-core";

/** Surrogate keys: unsigned auto-increment, read back with `$returningId()` (no RETURNING on MariaDB). */
export const id = () => bigint({ mode: "number", unsigned: true }).autoincrement().primaryKey();

/** A foreign key column of the same type as `id()`. */
export const ref = () => bigint({ mode: "number", unsigned: true });

/** Millisecond datetimes, stored as UTC. */
export const ms = () => datetime({ mode: "date", fsp: 3 });

export const createdAt = () => ms().notNull().default(sql`CURRENT_TIMESTAMP(3)`);

/** created/updated pair; a function so each table gets its own column builders. */
export const lifecycleDates = () => ({
  createdAt: createdAt(),
  updatedAt: ms()
    .notNull()
    .default(sql`CURRENT_TIMESTAMP(3)`)
    .$onUpdate(() => new Date()),
});
