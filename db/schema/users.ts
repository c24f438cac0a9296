import { boolean, index, mysqlEnum, mysqlTable, uniqueIndex, varchar, char } from "drizzle-orm/mysql-core";
import { createdAt, id, lifecycleDates, ms, ref } from "./util/columns";

export const users = mysqlTable(
  "users",
  {
    id: id(),
    /** Stored lower-cased; the sign-in form lower-cases too. */
    email: varchar({ length: 254 }).notNull(),
    name: varchar({ length: 120 }).notNull(),
    passwordHash: varchar({ length: 100 }).notNull(),
    units: mysqlEnum(["metric", "imperial"]).notNull().default("metric"),
    /** Verdict "act" alerts by e-mail; each user can turn them off. */
    alertEmails: boolean().notNull().default(true),
    /** Sessions signed in before this time are void (set by a password reset: ends stolen sessions too). */
    sessionsValidAfter: ms(),
    ...lifecycleDates(),
  },
  (t) => [uniqueIndex("users_email_uq").on(t.email)],
);

/**
 * Sessions ended by signing out. Sessions are signed cookies (stateless, so any instance can read
 * them); this short list makes a copied cookie useless after sign-out. Rows go once the session
 * would have expired anyway.
 */
export const revokedSessions = mysqlTable("revoked_sessions", {
  /** The session's random id, carried in its signed cookie. */
  sid: char({ length: 32 }).primaryKey(),
  userId: ref().notNull().references(() => users.id, { onDelete: "cascade" }),
  expiresAt: ms().notNull(),
  createdAt: createdAt(),
});

export const passwordResets = mysqlTable(
  "password_resets",
  {
    id: id(),
    userId: ref().notNull().references(() => users.id, { onDelete: "cascade" }),
    /** SHA-256 of the token in the e-mailed link; the token itself is never stored. */
    tokenHash: char({ length: 64 }).notNull(),
    expiresAt: ms().notNull(),
    usedAt: ms(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("password_resets_token_uq").on(t.tokenHash), index("password_resets_user_idx").on(t.userId)],
);

export const apiTokens = mysqlTable(
  "api_tokens",
  {
    id: id(),
    userId: ref().notNull().references(() => users.id, { onDelete: "cascade" }),
    name: varchar({ length: 80 }).notNull(),
    /** First characters of the token, shown in the list so a user can tell tokens apart. */
    tokenPrefix: varchar({ length: 16 }).notNull(),
    tokenHash: char({ length: 64 }).notNull(),
    lastUsedAt: ms(),
    revokedAt: ms(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("api_tokens_token_uq").on(t.tokenHash), index("api_tokens_user_idx").on(t.userId)],
);

/** Sign-in attempts, kept in the database so every app instance sees the same counts. */
export const loginAttempts = mysqlTable(
  "login_attempts",
  {
    id: id(),
    email: varchar({ length: 254 }).notNull(),
    ip: varchar({ length: 64 }).notNull(),
    succeeded: boolean().notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    index("login_attempts_email_created_idx").on(t.email, t.createdAt),
    index("login_attempts_ip_created_idx").on(t.ip, t.createdAt),
  ],
);

export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type ApiToken = typeof apiTokens.$inferSelect;
