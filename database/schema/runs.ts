import { bigint, boolean, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
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
    /** Inputs key of this run's flags stored in this round (see run_checks.inputs_key). */
    checkedKey: text("checked_key"),
  },
  (t) => [primaryKey({ columns: [t.roundId, t.runId] })],
);

/** Statistics of one series column, as the checker's `analyseSeries` returns them. */
export type StoredColumnStats = {
  column: string; n: number; truncationIndex: number; truncationTime: number; truncationAtLimit: boolean;
  mean: number; standardError: number; z: number; tau: number; ess: number;
};
export type AttachmentAnalysis =
  | {
      kind: "series";
      /** MSER batch size the statistics were computed with (the venue policy's `mserBatch`) */
      batch: number;
      stats: { tStart: number; tEnd: number; dt: number; rows: number; windowStart: number; columns: Record<string, StoredColumnStats> } | null;
    }
  | { kind: "spectrum"; columns: Record<string, number[]> };
export type AttachmentPlot = { columns: string[]; points: Record<string, { x: number; y: number }[]> };

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
    /**
     * What the checker needs, computed once when the file arrived (the file itself stays in
     * object storage): a series' statistics per column, or a spectrum's columns (one row per degree).
     * Null until the analysis has run.
     */
    analysis: jsonb("analysis").$type<AttachmentAnalysis>(),
    /** A downsampled copy for plots (at most a few thousand points), made with the analysis. */
    plot: jsonb("plot").$type<AttachmentPlot>(),
    active: boolean("active").notNull().default(true),
    /** The file's format (csv, columns, hdf5, netcdf) and, for the last three, the map that named its columns. */
    format: text("format").notNull().default("csv"),
    sourceMap: text("source_map"),
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

/**
 * The author's column maps (whitespace-separated column files) and dataset maps (HDF5, NetCDF),
 * kept per submission like the namelist key map: `series.columns`, `spectrum.hdf5`, … → the map.
 */
export const seriesFileMaps = pgTable("series_file_maps", {
  submissionId: uuid("submission_id")
    .primaryKey()
    .references(() => submissions.id, { onDelete: "cascade" }),
  maps: jsonb("maps").$type<Record<string, string>>().notNull(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

/**
 * The checker's view of one run version under its venue's policy: derived numbers (the runs
 * table sorts on the typed columns) and the key of the inputs they came from. Written by the
 * check job; pages and the API only read it.
 */
export const runChecks = pgTable(
  "run_checks",
  {
    runVersionId: uuid("run_version_id")
      .primaryKey()
      .references(() => runVersions.id, { onDelete: "cascade" }),
    /** Digest of policy, record version and attached analyses: unchanged key, nothing to re-check. */
    inputsKey: text("inputs_key").notNull(),
    derived: jsonb("derived").$type<Record<string, unknown>>().notNull(),
    e: doublePrecision("e"),
    ra: doublePrecision("ra"),
    raRotating: doublePrecision("ra_rotating"),
    pr: doublePrecision("pr"),
    pm: doublePrecision("pm"),
    rm: doublePrecision("rm"),
    runLengthMagnetic: doublePrecision("run_length_magnetic"),
    checkedAt: timestamp("checked_at", { withTimezone: true }).notNull().defaultNow(),
  },
);
