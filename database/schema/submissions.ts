import { boolean, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { venues } from "./venues";

export const submissionStageEnum = pgEnum("submission_stage", [
  "draft",
  "with-editor",
  "in-review",
  "decided",
  "withdrawn",
]);
export const submissionRoleEnum = pgEnum("submission_role", ["author", "co-author", "reviewer"]);

/** One manuscript; its rounds, runs and claims hang below it. */
export const submissions = pgTable(
  "submissions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    venueId: uuid("venue_id")
      .notNull()
      .references(() => venues.id, { onDelete: "restrict" }),
    title: text("title").notNull(),
    abstract: text("abstract").notNull().default(""),
    keywords: text("keywords").array().notNull().default([]),
    /** Data and code availability statement, with the DOIs it cites. */
    availability: text("availability").notNull().default(""),
    dois: text("dois").array().notNull().default([]),
    manuscriptFileId: uuid("manuscript_file_id"),
    stage: submissionStageEnum("stage").notNull().default("draft"),
    createdBy: text("created_by")
      .notNull()
      .references(() => user.id, { onDelete: "restrict" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("submissions_venue_idx").on(t.venueId)],
);

/** Who may see a submission and in which capacity. A person holds one row per role. */
export const submissionMembers = pgTable(
  "submission_members",
  {
    submissionId: uuid("submission_id")
      .notNull()
      .references(() => submissions.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    role: submissionRoleEnum("role").notNull(),
    corresponding: boolean("corresponding").notNull().default(false),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    primaryKey({ columns: [t.submissionId, t.userId, t.role] }),
    index("submission_members_user_idx").on(t.userId),
  ],
);

/**
 * The people listed on a submission, in author order, with their CRediT roles. A listed person
 * without an account yet has only an e-mail; the invitation link attaches the account.
 */
export const contributors = pgTable(
  "contributors",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    submissionId: uuid("submission_id")
      .notNull()
      .references(() => submissions.id, { onDelete: "cascade" }),
    userId: text("user_id").references(() => user.id, { onDelete: "set null" }),
    position: integer("position").notNull(),
    name: text("name").notNull(),
    email: text("email").notNull(),
    affiliation: text("affiliation").notNull().default(""),
    orcid: text("orcid"),
    creditRoles: text("credit_roles").array().notNull().default([]),
    corresponding: boolean("corresponding").notNull().default(false),
    inviteTokenHash: text("invite_token_hash"),
    invitedAt: timestamp("invited_at", { withTimezone: true }),
    detail: jsonb("detail").$type<Record<string, unknown>>().notNull().default({}),
  },
  (t) => [index("contributors_submission_idx").on(t.submissionId)],
);
