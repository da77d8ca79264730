import { index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";

export const outboxStateEnum = pgEnum("outbox_state", ["queued", "sent", "gave-up"]);

export type OutboxAttachment = { filename: string; contentType: string; contentBase64: string };

/** Every message is written here first, in the same transaction as the change it reports. */
export const outbox = pgTable(
  "outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body").notNull(),
    attachments: jsonb("attachments").$type<OutboxAttachment[]>().notNull().default([]),
    state: outboxStateEnum("state").notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    dedupeKey: text("dedupe_key").unique(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
  },
  (t) => [index("outbox_due_idx").on(t.state, t.nextAttemptAt)],
);
