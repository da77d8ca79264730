import { bigint, integer, pgTable, text, timestamp } from "drizzle-orm/pg-core";

/**
 * Counters of rate-limiter-flexible's Drizzle store (sign-in attempts per account and per address,
 * password-reset and invitation mails, API calls per token): one row per key, shared by every process.
 */
export const rateLimitCounter = pgTable("rate_limit_counter", {
  key: text("key").primaryKey(),
  points: integer("points").notNull().default(0),
  expire: timestamp("expire", { withTimezone: true }),
});

/** better-auth's own limit on its endpoints (`rateLimit.storage: "database"`), per address and path. */
export const rateLimit = pgTable("rate_limit", {
  id: text("id").primaryKey(),
  key: text("key").notNull().unique(),
  count: integer("count").notNull(),
  lastRequest: bigint("last_request", { mode: "number" }).notNull(),
});
