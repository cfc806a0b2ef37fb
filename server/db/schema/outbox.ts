import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";

import { users } from "./users";

export const outboxStatusEnum = pgEnum("outbox_status", [
  "pending",
  "sending",
  "sent",
  "failed",
  "uncertain",
]);

/**
 * E-mail waiting to be sent, written in the transaction of the change that causes it. A worker
 * claims a row (status `sending`, committed) before talking to SMTP, so two workers never send the
 * same row; a row left in `sending` by a process that died is marked `uncertain` and not sent again.
 */
export const outbox = pgTable(
  "outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    topic: text("topic").notNull(),
    recipient: text("recipient").notNull(),
    /**
     * The person the e-mail is for. An address may belong to an account in one network and to a
     * pending invitation in another, so a network's lists of its mail follow this, never the address.
     */
    recipientId: uuid("recipient_id").references(() => users.id, { onDelete: "set null" }),
    subject: text("subject").notNull(),
    /** Dropped once sent: bodies may carry one-time links. */
    textBody: text("text_body"),
    htmlBody: text("html_body"),
    status: outboxStatusEnum("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    claimedAt: timestamp("claimed_at", { withTimezone: true }),
    claimedBy: text("claimed_by"),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    lastError: text("last_error"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    index("outbox_due_idx").on(table.status, table.nextAttemptAt),
    index("outbox_recipient_idx").on(table.recipientId),
  ],
);
