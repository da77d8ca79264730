import { index, integer, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import type { StatedComparison } from "../../app/checker/comparisons";
import { rounds } from "./rounds";

/**
 * A figure or statement of the manuscript in one round: the `runproof.claim/1` record plus
 * the figure number and the text. A later round starts from copies of these rows.
 */
export const claims = pgTable(
  "claims",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    roundId: uuid("round_id")
      .notNull()
      .references(() => rounds.id, { onDelete: "cascade" }),
    /** The same claim across rounds shares this key, so round diffs can pair them. */
    lineage: uuid("lineage").notNull().defaultRandom(),
    position: integer("position").notNull().default(0),
    figure: text("figure"),
    statement: text("statement").notNull().default(""),
    record: jsonb("record").notNull(),
    version: integer("version").notNull().default(1),
    /** Digest of the inputs of this claim's stored flags (claim version, its runs' checks, policy). */
    checkedKey: text("checked_key"),
    /** Each stated value beside what the check job compared it with (interval, value, outcome); null until checked. */
    statedResults: jsonb("stated_results").$type<StatedComparison[]>(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("claims_round_idx").on(t.roundId)],
);
