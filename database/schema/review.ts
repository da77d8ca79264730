import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { flags } from "./flags";
import { rounds } from "./rounds";

export const invitationStateEnum = pgEnum("invitation_state", ["pending", "accepted", "declined", "withdrawn", "expired"]);
export const reviewStateEnum = pgEnum("review_state", ["in-progress", "submitted"]);
export const recommendationEnum = pgEnum("recommendation", ["accept", "minor-revision", "major-revision", "reject"]);
export const flagVerdictEnum = pgEnum("flag_verdict", ["agree", "dispute", "ask-authors"]);
export const anchorKindEnum = pgEnum("anchor_kind", ["round", "claim", "run", "flag"]);

/** An editor's request to review one round; the link tokens are stored hashed and work once. */
export const invitations = pgTable(
  "invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    roundId: uuid("round_id")
      .notNull()
      .references(() => rounds.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    userId: text("user_id").references(() => user.id, { onDelete: "set null" }),
    invitedBy: text("invited_by").references(() => user.id, { onDelete: "set null" }),
    dueAt: timestamp("due_at", { withTimezone: true }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    tokenExpiresAt: timestamp("token_expires_at", { withTimezone: true }).notNull(),
    state: invitationStateEnum("state").notNull().default("pending"),
    respondedAt: timestamp("responded_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("invitations_round_idx").on(t.roundId)],
);

/** One reviewer's report on one round. `number` is what authors see: "Reviewer 1", "Reviewer 2". */
export const reviews = pgTable(
  "reviews",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    roundId: uuid("round_id")
      .notNull()
      .references(() => rounds.id, { onDelete: "cascade" }),
    reviewerId: text("reviewer_id")
      .notNull()
      .references(() => user.id, { onDelete: "restrict" }),
    invitationId: uuid("invitation_id").references(() => invitations.id, { onDelete: "set null" }),
    number: integer("number").notNull(),
    state: reviewStateEnum("state").notNull().default("in-progress"),
    recommendation: recommendationEnum("recommendation"),
    /** Tiptap JSON, for the editor only: never released to authors. */
    editorNote: jsonb("editor_note"),
    dueAt: timestamp("due_at", { withTimezone: true }),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("reviews_round_reviewer_uq").on(t.roundId, t.reviewerId),
    uniqueIndex("reviews_round_number_uq").on(t.roundId, t.number),
  ],
);

/** A reviewer's verdict on one flag. */
export const flagVerdicts = pgTable(
  "flag_verdicts",
  {
    reviewId: uuid("review_id")
      .notNull()
      .references(() => reviews.id, { onDelete: "cascade" }),
    flagId: uuid("flag_id")
      .notNull()
      .references(() => flags.id, { onDelete: "cascade" }),
    verdict: flagVerdictEnum("verdict").notNull(),
    /** Why the reviewer disputes the flag or what they ask the authors (required for both; at most 2,000 characters). */
    reason: text("reason"),
    /** The authors' answer, written in the next round once the decision is released. */
    answer: text("answer"),
    answeredBy: text("answered_by").references(() => user.id, { onDelete: "set null" }),
    answeredAt: timestamp("answered_at", { withTimezone: true }),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.reviewId, t.flagId] }),
    check("flag_verdicts_reason_len", sql`${t.reason} is null or char_length(${t.reason}) <= 2000`),
    check("flag_verdicts_answer_len", sql`${t.answer} is null or char_length(${t.answer}) <= 20000`),
  ],
);

/** A reviewer's rich-text comment (Tiptap JSON), anchored to the round, a claim, a run or a flag. */
export const remarks = pgTable(
  "remarks",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    reviewId: uuid("review_id")
      .notNull()
      .references(() => reviews.id, { onDelete: "cascade" }),
    anchorKind: anchorKindEnum("anchor_kind").notNull(),
    /** claim id, run label or flag id; null for the round. */
    anchorRef: text("anchor_ref"),
    body: jsonb("body").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("remarks_review_idx").on(t.reviewId)],
);

/** The authors' answer to a released remark, written in the next round. */
export const remarkResponses = pgTable("remark_responses", {
  remarkId: uuid("remark_id")
    .primaryKey()
    .references(() => remarks.id, { onDelete: "cascade" }),
  roundId: uuid("round_id")
    .notNull()
    .references(() => rounds.id, { onDelete: "cascade" }),
  response: text("response").notNull(),
  authorId: text("author_id").references(() => user.id, { onDelete: "set null" }),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});
