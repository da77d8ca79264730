import { integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { submissions } from "./submissions";

/** One listed person as the round was sent (no e-mail: it never leaves the authors' pages). */
export type SentContributor = { position: number; name: string; affiliation: string; orcid: string | null; creditRoles: string[]; corresponding: boolean };

export const roundStateEnum = pgEnum("round_state", ["draft", "sent", "under-review", "reviews-in", "decided"]);
export const decisionEnum = pgEnum("decision", ["accept", "minor-revision", "major-revision", "reject"]);

/**
 * Round N of a submission. A draft round is the authors' to change; sending freezes it
 * (its run versions and claims) for the editor and reviewers. `version` guards concurrent
 * state changes (optimistic concurrency: update … where version = seen).
 */
export const rounds = pgTable(
  "rounds",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    submissionId: uuid("submission_id")
      .notNull()
      .references(() => submissions.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    state: roundStateEnum("state").notNull().default("draft"),
    version: integer("version").notNull().default(1),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    sentBy: text("sent_by").references(() => user.id, { onDelete: "set null" }),
    decision: decisionEnum("decision"),
    /** The editor's decision letter as Tiptap JSON. */
    letter: jsonb("letter"),
    decidedAt: timestamp("decided_at", { withTimezone: true }),
    decidedBy: text("decided_by").references(() => user.id, { onDelete: "set null" }),
    releasedAt: timestamp("released_at", { withTimezone: true }),
    /** When the flags were last recomputed, and a digest of the inputs they came from. */
    checkedAt: timestamp("checked_at", { withTimezone: true }),
    /**
     * Why the last re-check failed (null when it succeeded). While set, the stored flags are
     * from an earlier check and are shown as out of date, and the round cannot be sent.
     */
    checkError: text("check_error"),
    /**
     * The manuscript as sent in this round: title, abstract, keywords, file and contributor list,
     * copied when the round is sent. Everyone but the authors reads these, so a draft's edits
     * never reach the editor or reviewers before the next round is sent.
     */
    sentTitle: text("sent_title"),
    sentAbstract: text("sent_abstract"),
    sentKeywords: text("sent_keywords").array(),
    sentManuscriptFileId: uuid("sent_manuscript_file_id"),
    sentContributors: jsonb("sent_contributors").$type<SentContributor[]>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("rounds_submission_number_uq").on(t.submissionId, t.number)],
);
