import { char, index, json, mysqlEnum, mysqlTable, primaryKey, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { createdAt, id, lifecycleDates, ms, ref } from "./util/columns";
import { users } from "./users";

export const roles = ["lead", "pilot", "observer"] as const;
export type Role = (typeof roles)[number];

export const crews = mysqlTable("crews", {
  id: id(),
  name: varchar({ length: 120 }).notNull(),
  /** Crew-wide analysis thresholds; builds may override them. Shape checked by lib/validations. */
  thresholds: json().$type<Record<string, number>>(),
  ...lifecycleDates(),
});

export const memberships = mysqlTable(
  "memberships",
  {
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    userId: ref().notNull().references(() => users.id, { onDelete: "cascade" }),
    role: mysqlEnum(roles).notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ name: "memberships_pk", columns: [t.crewId, t.userId] }), index("memberships_user_idx").on(t.userId)],
);

export const invitations = mysqlTable(
  "invitations",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    email: varchar({ length: 254 }).notNull(),
    role: mysqlEnum(roles).notNull(),
    /** SHA-256 of the one-time token in the e-mailed link. */
    tokenHash: char({ length: 64 }).notNull(),
    invitedBy: ref().references(() => users.id, { onDelete: "set null" }),
    expiresAt: ms().notNull(),
    acceptedAt: ms(),
    acceptedBy: ref().references(() => users.id, { onDelete: "set null" }),
    revokedAt: ms(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("invitations_token_uq").on(t.tokenHash),
    index("invitations_crew_idx").on(t.crewId),
    index("invitations_email_idx").on(t.email),
  ],
);

export type Crew = typeof crews.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;
