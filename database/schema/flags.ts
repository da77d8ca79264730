import { index, jsonb, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { claims } from "./claims";
import { rounds } from "./rounds";
import { runVersions } from "./runs";

export const severityEnum = pgEnum("flag_severity", ["mismatch", "caution", "note"]);

/**
 * The checker's findings for a round, replaced as a whole on every re-check (in one transaction).
 * `fingerprint` (rule + run label + claim lineage + quantities) pairs the same finding across
 * re-checks and rounds, so an author's answer survives a re-check and rounds can be diffed.
 */
export const flags = pgTable(
  "flags",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    roundId: uuid("round_id")
      .notNull()
      .references(() => rounds.id, { onDelete: "cascade" }),
    fingerprint: text("fingerprint").notNull(),
    rule: text("rule").notNull(),
    severity: severityEnum("severity").notNull(),
    runLabel: text("run_label"),
    /** For a run's own flags: the run version they were computed from. */
    runVersionId: uuid("run_version_id").references(() => runVersions.id, { onDelete: "cascade" }),
    claimId: uuid("claim_id").references(() => claims.id, { onDelete: "cascade" }),
    quantities: text("quantities").array().notNull(),
    message: text("message").notNull(),
    /** expected / found / tolerance / source / any extra keys of the checker's flag. */
    detail: jsonb("detail").$type<Record<string, unknown>>().notNull(),
    authorAnswer: text("author_answer"),
    answeredBy: text("answered_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("flags_round_idx").on(t.roundId), index("flags_fingerprint_idx").on(t.roundId, t.fingerprint)],
);
