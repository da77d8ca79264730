import { bigint, boolean, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { storedFiles } from "./files";
import { rounds } from "./rounds";
import { submissions } from "./submissions";

/** A simulation run of a submission, named by its label; its content lives in versions. */
export const runs = pgTable(
  "runs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    submissionId: uuid("submission_id")
      .notNull()
      .references(() => submissions.id, { onDelete: "cascade" }),
    label: text("label").notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("runs_submission_label_uq").on(t.submissionId, t.label)],
);

/** Every edit of a run makes a new version; old versions stay for the rounds that used them. */
export const runVersions = pgTable(
  "run_versions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    /** The `runproof.run/1` record exactly as validated. */
    record: jsonb("record").notNull(),
    /** How this version arrived: form, json, namelist, api. */
    origin: text("origin").notNull().default("form"),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("run_versions_run_version_uq").on(t.runId, t.version)],
);

/** Which version of each run a round uses; frozen when the round is sent. */
export const roundRuns = pgTable(
  "round_runs",
  {
    roundId: uuid("round_id")
      .notNull()
      .references(() => rounds.id, { onDelete: "cascade" }),
    runId: uuid("run_id")
      .notNull()
      .references(() => runs.id, { onDelete: "cascade" }),
    runVersionId: uuid("run_version_id")
      .notNull()
      .references(() => runVersions.id, { onDelete: "restrict" }),
  },
  (t) => [primaryKey({ columns: [t.roundId, t.runId] })],
);

export const attachmentKindEnum = pgEnum("attachment_kind", ["series", "spectrum"]);

/** A time-series or spectrum CSV of a run version; the bytes are in object storage. */
export const attachments = pgTable(
  "attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    runVersionId: uuid("run_version_id")
      .notNull()
      .references(() => runVersions.id, { onDelete: "cascade" }),
    kind: attachmentKindEnum("kind").notNull(),
    fileId: uuid("file_id")
      .notNull()
      .references(() => storedFiles.id, { onDelete: "restrict" }),
    columns: text("columns").array().notNull(),
    rowCount: bigint("row_count", { mode: "number" }).notNull(),
    /** Parsed values kept for the checker and plots: { column: number[] }. */
    data: jsonb("data").$type<Record<string, number[]>>().notNull(),
    active: boolean("active").notNull().default(true),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("attachments_version_idx").on(t.runVersionId)],
);

/** The author's own namelist keys mapped to our quantities, kept per submission. */
export const namelistMaps = pgTable("namelist_maps", {
  submissionId: uuid("submission_id")
    .primaryKey()
    .references(() => submissions.id, { onDelete: "cascade" }),
  map: jsonb("map").$type<Record<string, string>>().notNull(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});
