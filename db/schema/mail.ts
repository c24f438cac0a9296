import { index, mediumtext, mysqlEnum, mysqlTable, smallint, text, varchar } from "drizzle-orm/mysql-core";
import { ms, id, lifecycleDates } from "./util/columns";

export const mailStates = ["pending", "sent", "failed"] as const;
export type MailState = (typeof mailStates)[number];

/**
 * Outgoing mail. A message is written here first and sent by whichever instance claims it, so an
 * SMTP outage delays mail instead of losing it; failures back off and are retried. Bodies are
 * cleared once sent (they can hold invitation and reset links).
 */
export const mailOutbox = mysqlTable(
  "mail_outbox",
  {
    id: id(),
    toAddress: varchar({ length: 254 }).notNull(),
    subject: varchar({ length: 300 }).notNull(),
    textBody: mediumtext().notNull(),
    htmlBody: mediumtext().notNull(),
    /** What the message is, for the server log and tests ("invitation", "password-reset", "run-alert"). */
    kind: varchar({ length: 40 }).notNull(),
    state: mysqlEnum(mailStates).notNull().default("pending"),
    attempts: smallint({ unsigned: true }).notNull().default(0),
    /** Not before this time: back-off after a failure, or a short lease while one instance sends. */
    nextAttemptAt: ms().notNull(),
    lastError: text(),
    sentAt: ms(),
    ...lifecycleDates(),
  },
  (t) => [index("mail_outbox_state_next_idx").on(t.state, t.nextAttemptAt)],
);

export type OutboxMail = typeof mailOutbox.$inferSelect;
