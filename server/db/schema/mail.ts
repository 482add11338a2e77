import { sql } from "drizzle-orm";
import { index, integer, pgEnum, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { MAIL_STATUSES } from "../../../shared/schemas/mail";

/** Outbox states: pending until sent; failed after the last attempt. */
export const mailStatusEnum = pgEnum("mail_status", MAIL_STATUSES);

/**
 * Rendered mail waiting for the dispatcher. Rows are written in the caller's transaction, so a mail
 * exists exactly when the change that caused it committed, and sending never blocks or undoes it.
 */
export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    toAddresses: text("to_addresses").array().notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    html: text("html"),
    template: text("template").notNull(),
    status: mailStatusEnum("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
  },
  (t) => [
    index("mail_outbox_due_idx")
      .on(t.nextAttemptAt)
      .where(sql`${t.status} = 'pending'`),
  ],
);

/** What the development/test SMTP sink received, newest last by id. */
export const mailSinkMessages = pgTable(
  "mail_sink_messages",
  {
    id: integer("id").primaryKey().generatedAlwaysAsIdentity(),
    receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
    envelopeFrom: text("envelope_from").notNull(),
    envelopeTo: text("envelope_to").array().notNull(),
    messageId: text("message_id"),
    subject: text("subject").notNull().default(""),
    text: text("text").notNull().default(""),
    html: text("html"),
    raw: text("raw").notNull(),
  },
  (t) => [index("mail_sink_messages_received_idx").on(t.receivedAt)],
);
