import { index, json, mysqlTable, varchar } from "drizzle-orm/mysql-core";
import { crews } from "./crews";
import { createdAt, id, ref } from "./util/columns";
import { users } from "./users";

/** Sign-ins, role changes, deletions, share links and exports, for leads to review. */
export const auditLog = mysqlTable(
  "audit_log",
  {
    id: id(),
    crewId: ref().references(() => crews.id, { onDelete: "cascade" }),
    actorId: ref().references(() => users.id, { onDelete: "set null" }),
    action: varchar({ length: 64 }).notNull(),
    targetType: varchar({ length: 40 }),
    targetId: varchar({ length: 64 }),
    detail: json().$type<Record<string, unknown>>(),
    ip: varchar({ length: 64 }),
    createdAt: createdAt(),
  },
  (t) => [index("audit_log_crew_created_idx").on(t.crewId, t.createdAt), index("audit_log_actor_idx").on(t.actorId)],
);

export type AuditEntry = typeof auditLog.$inferSelect;
