import { index, json, mysqlTable, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { crews } from "./crews";
import { id, lifecycleDates, ref } from "./util/columns";
import { users } from "./users";

/** A saved mapping from CSV headers to fields and units, chosen on upload. */
export const columnMaps = mysqlTable(
  "column_maps",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    name: varchar({ length: 80 }).notNull(),
    /** Shape owned by lib/parsers (validated with zod before it is stored). */
    mapping: json().$type<Record<string, unknown>>().notNull(),
    createdBy: ref().references(() => users.id, { onDelete: "set null" }),
    ...lifecycleDates(),
  },
  (t) => [uniqueIndex("column_maps_crew_name_uq").on(t.crewId, t.name), index("column_maps_crew_idx").on(t.crewId)],
);

export type ColumnMap = typeof columnMaps.$inferSelect;
