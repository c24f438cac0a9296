import { char, index, int, mysqlTable, uniqueIndex } from "drizzle-orm/mysql-core";
import { runs } from "./runs";
import { createdAt, id, ms, ref } from "./util/columns";
import { users } from "./users";

/** Read-only link to one debrief for people without an account. */
export const shareLinks = mysqlTable(
  "share_links",
  {
    id: id(),
    runId: ref().notNull().references(() => runs.id, { onDelete: "cascade" }),
    tokenHash: char({ length: 64 }).notNull(),
    createdBy: ref().references(() => users.id, { onDelete: "set null" }),
    expiresAt: ms().notNull(),
    revokedAt: ms(),
    viewCount: int({ unsigned: true }).notNull().default(0),
    lastViewedAt: ms(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("share_links_token_uq").on(t.tokenHash), index("share_links_run_idx").on(t.runId)],
);

export type ShareLink = typeof shareLinks.$inferSelect;
