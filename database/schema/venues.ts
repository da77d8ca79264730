import { jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";

export const blindingEnum = pgEnum("blinding", ["single", "double"]);
export const venueRoleEnum = pgEnum("venue_role", ["editor"]);

/** A journal or special issue hosted in this instance. */
export const venues = pgTable("venues", {
  id: uuid("id").primaryKey().defaultRandom(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  publisher: text("publisher"),
  blinding: blindingEnum("blinding").notNull().default("single"),
  /** Overrides of the checker's default thresholds for this venue's rounds. */
  checkerPolicy: jsonb("checker_policy").$type<Record<string, unknown>>().notNull().default({}),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const venueMembers = pgTable(
  "venue_members",
  {
    venueId: uuid("venue_id")
      .notNull()
      .references(() => venues.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    role: venueRoleEnum("role").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.venueId, t.userId, t.role] })],
);
