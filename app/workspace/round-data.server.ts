import { and, asc, desc, eq, inArray, sql, type SQL } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, flags, roundRuns, runChecks, runs, runVersions, storedFiles } from "~db/schema";
import type { RunRecord } from "~/checker/schema";
import { seriesSummary } from "~/checker/derive";
import type { SeriesStats } from "~/checker/series";
import { encodeClaimOverlay, encodeRunPlots, type ClaimOverlayColumns, type RunPlotColumns } from "./plot-columns";
import type { RunRow, SeriesPlot, SpectrumPlot } from "./view-types";

export type { RunRow, SeriesPlot, SpectrumPlot };

/** Orders the runs table can be sorted by (SQL columns; unknown values last in both directions). */
export const RUN_ROW_SORTS = ["label", "version", "updatedAt", "flags", "mismatch", "caution", "note", "E", "Ra", "RaRotating", "Pr", "Pm", "Rm", "runLengthMagnetic"] as const;
export type RunRowSort = (typeof RUN_ROW_SORTS)[number];
export type RunRowQuery = { sort?: RunRowSort; dir?: "asc" | "desc"; limit?: number; offset?: number };

function rowQuery(db: Database, roundId: string) {
  // Flag counts per run label in one grouped subquery (run flags and claim flags naming the run).
  const counts = db
    .select({
      runLabel: flags.runLabel,
      mismatch: sql<number>`count(*) filter (where ${flags.severity} = 'mismatch')::int`.as("mismatch"),
      caution: sql<number>`count(*) filter (where ${flags.severity} = 'caution')::int`.as("caution"),
      note: sql<number>`count(*) filter (where ${flags.severity} = 'note')::int`.as("note"),
    })
    .from(flags)
    .where(eq(flags.roundId, roundId))
    .groupBy(flags.runLabel)
    .as("counts");
  const cols = {
    runId: runs.id,
    label: runs.label,
    version: runVersions.version,
    origin: runVersions.origin,
    updatedAt: runVersions.createdAt,
    E: runChecks.e,
    Ra: runChecks.ra,
    RaRotating: runChecks.raRotating,
    Pr: runChecks.pr,
    Pm: runChecks.pm,
    Rm: runChecks.rm,
    runLengthMagnetic: runChecks.runLengthMagnetic,
    mismatch: sql<number>`coalesce(${counts.mismatch}, 0)`,
    caution: sql<number>`coalesce(${counts.caution}, 0)`,
    note: sql<number>`coalesce(${counts.note}, 0)`,
    checkedKey: roundRuns.checkedKey,
  };
  const query = db
    .select(cols)
    .from(roundRuns)
    .innerJoin(runs, eq(runs.id, roundRuns.runId))
    .innerJoin(runVersions, eq(runVersions.id, roundRuns.runVersionId))
    .leftJoin(runChecks, eq(runChecks.runVersionId, roundRuns.runVersionId))
    .leftJoin(counts, eq(counts.runLabel, runs.label))
    .where(eq(roundRuns.roundId, roundId));
  return { query, cols, counts };
}

/**
 * The runs table of a round: key controls and derived numbers as the check job stored them for
 * each run version, and flag counts — read, never recomputed. `checking` marks a run whose
 * check has not landed yet (its numbers are blank until then). Sorted and paged in SQL.
 */
export async function roundRunRows(db: Database, roundId: string, q: RunRowQuery = {}): Promise<RunRow[]> {
  const { query, cols, counts } = rowQuery(db, roundId);
  const key: Record<RunRowSort, SQL | typeof cols.label> = {
    label: cols.label,
    version: sql`${cols.version}`,
    updatedAt: sql`${cols.updatedAt}`,
    flags: sql`coalesce(${counts.mismatch}, 0) * 1000000 + coalesce(${counts.caution}, 0) * 1000 + coalesce(${counts.note}, 0)`,
    mismatch: sql`coalesce(${counts.mismatch}, 0)`,
    caution: sql`coalesce(${counts.caution}, 0)`,
    note: sql`coalesce(${counts.note}, 0)`,
    E: sql`${cols.E}`,
    Ra: sql`${cols.Ra}`,
    RaRotating: sql`${cols.RaRotating}`,
    Pr: sql`${cols.Pr}`,
    Pm: sql`${cols.Pm}`,
    Rm: sql`${cols.Rm}`,
    runLengthMagnetic: sql`${cols.runLengthMagnetic}`,
  };
  const sort = q.sort ?? "label";
  const dir = q.dir === "desc" ? "desc" : "asc";
  const byLabel = sql`${cols.label} collate "C"`;
  let ordered = query.orderBy(
    sort === "label" ? (dir === "desc" ? desc(byLabel) : asc(byLabel)) : sql`${key[sort]} ${sql.raw(dir)} nulls last`,
    asc(byLabel),
  ).$dynamic();
  if (q.limit !== undefined) ordered = ordered.limit(Math.max(0, Math.min(q.limit, 1000)));
  if (q.offset !== undefined) ordered = ordered.offset(Math.max(0, q.offset));
  const rows = await ordered;
  return rows.map(({ checkedKey, updatedAt, ...r }) => ({ ...r, updatedAt: updatedAt.toISOString(), checking: checkedKey === null }));
}

/**
 * Every run's place in parameter space (label, E, rotating Ra) as the check job stored them: the
 * little the parameter-space chart draws, without the flag counts or the rest of the row.
 */
export async function roundRunPoints(db: Database, roundId: string) {
  return db
    .select({ runId: runs.id, label: runs.label, E: runChecks.e, RaRotating: runChecks.raRotating })
    .from(roundRuns)
    .innerJoin(runs, eq(runs.id, roundRuns.runId))
    .leftJoin(runChecks, eq(runChecks.runVersionId, roundRuns.runVersionId))
    .where(eq(roundRuns.roundId, roundId))
    .orderBy(sql`${runs.label} collate "C"`);
}

/** The round's runs that have a series or a spectrum attached (which plots exist, not their data). */
export async function roundRunsWithPlots(db: Database, roundId: string) {
  return db
    .select({
      runId: runs.id,
      label: runs.label,
      series: sql<boolean>`bool_or(${attachments.kind} = 'series')`,
      spectrum: sql<boolean>`bool_or(${attachments.kind} = 'spectrum')`,
    })
    .from(roundRuns)
    .innerJoin(runs, eq(runs.id, roundRuns.runId))
    .innerJoin(attachments, and(eq(attachments.runVersionId, roundRuns.runVersionId), eq(attachments.active, true), inArray(attachments.kind, ["series", "spectrum"])))
    .where(eq(roundRuns.roundId, roundId))
    .groupBy(runs.id, runs.label)
    .orderBy(sql`${runs.label} collate "C"`);
}

/** How many runs a round has (for paging). */
export async function roundRunCount(db: Database, roundId: string) {
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(roundRuns).where(eq(roundRuns.roundId, roundId));
  return row?.n ?? 0;
}

/** Derived values of one run version as the check job stored them ({} before the first check). */
export async function storedDerived(db: Database, runVersionId: string): Promise<Record<string, unknown>> {
  const [row] = await db.select({ derived: runChecks.derived }).from(runChecks).where(eq(runChecks.runVersionId, runVersionId));
  return row?.derived ?? {};
}

type PlotFileRow = {
  id: string; runVersionId: string; kind: "series" | "spectrum"; analysis: import("~db/schema").AttachmentAnalysis | null;
  plot: import("~db/schema").AttachmentPlot | null; rowCount: number; filename: string; size: number;
};

function plotFiles(db: Database, runVersionIds: string[], kinds: PlotFileRow["kind"][] = ["series", "spectrum"]): Promise<PlotFileRow[]> {
  if (!runVersionIds.length) return Promise.resolve([]);
  return db
    .select({ id: attachments.id, runVersionId: attachments.runVersionId, kind: attachments.kind, analysis: attachments.analysis, plot: attachments.plot, rowCount: attachments.rowCount, filename: storedFiles.filename, size: storedFiles.size })
    .from(attachments)
    .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
    .where(and(inArray(attachments.runVersionId, runVersionIds), eq(attachments.active, true), inArray(attachments.kind, kinds)));
}

function plotsOf(rows: PlotFileRow[], record: RunRecord) {
  let series: SeriesPlot | null = null;
  let spectrum: SpectrumPlot | null = null;
  let analysing = false;
  for (const a of rows) {
    if (!a.analysis || !a.plot) {
      analysing = true;
      continue;
    }
    if (a.kind === "series" && a.analysis.kind === "series") {
      const stats = a.analysis.stats as SeriesStats | null | undefined;
      series = {
        columns: a.plot.columns, points: a.plot.points, tStart: stats?.tStart ?? 0, windowStart: stats?.windowStart ?? 0, tEnd: stats?.tEnd ?? 0, rows: a.rowCount,
        ...(stats ? { stats: seriesSummary(stats) } : {}),
      };
    } else if (a.analysis.kind === "spectrum") {
      const cols = a.analysis.columns;
      const l = cols.l ?? [];
      const columns = Object.keys(cols).filter((c) => c !== "l");
      // One row per degree; a very long spectrum is thinned evenly for the chart.
      const step = Math.max(1, Math.ceil(l.length / 2000));
      const points: SpectrumPlot["points"] = [];
      for (let i = 0; i < l.length; i += step) points.push(Object.fromEntries([["l", l[i]!], ...columns.map((c) => [c, cols[c]![i]!])]) as SpectrumPlot["points"][number]);
      spectrum = { columns, points, truncationDegree: record.resolution?.maxDegree ?? l[l.length - 1] ?? 0 };
    }
  }
  const files = rows.map((a) => ({ id: a.id, kind: a.kind, filename: a.filename, rowCount: a.rowCount, size: a.size }));
  return { series, spectrum, files, analysing };
}

/**
 * Plots of one run version, column-wise for the plots route: the downsampled copies and the
 * series window stored when the file was analysed (`analysing` until the check job has analysed
 * a new file).
 */
export async function runPlotColumns(db: Database, runVersionId: string, record: RunRecord): Promise<RunPlotColumns> {
  return encodeRunPlots(plotsOf(await plotFiles(db, [runVersionId]), record));
}

/**
 * The files of one run version and which plots they give, without the plot copies themselves
 * (the run page lists the files and fetches the plots from the plots route once it is on screen).
 * `plotKey` names the analysed files, so the page fetches the plots again when it changes.
 */
export async function runPlotFiles(db: Database, runVersionId: string) {
  const rows = await db
    .select({
      id: attachments.id, kind: attachments.kind, rowCount: attachments.rowCount, filename: storedFiles.filename, size: storedFiles.size,
      analysed: sql<boolean>`(${attachments.analysis} is not null and ${attachments.plot} is not null)`,
    })
    .from(attachments)
    .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
    .where(and(eq(attachments.runVersionId, runVersionId), eq(attachments.active, true), inArray(attachments.kind, ["series", "spectrum"])));
  const analysed = rows.filter((r) => r.analysed);
  return {
    files: rows.map(({ analysed: _, ...file }) => file),
    analysing: analysed.length < rows.length,
    series: analysed.some((r) => r.kind === "series"),
    spectrum: analysed.some((r) => r.kind === "spectrum"),
    plotKey: analysed.map((r) => r.id).sort().join(","),
  };
}

/**
 * Which of a claim's runs (one version each) have an analysed series to overlay, without the plot
 * copies (the claim page names them and fetches the overlay once it is on screen). `overlayKey`
 * names the analysed files, so the page fetches the overlay again when it changes.
 */
export async function claimOverlayRuns(db: Database, versions: { versionId: string; label: string }[]) {
  const rows = versions.length
    ? await db
        .select({ id: attachments.id, runVersionId: attachments.runVersionId, analysed: sql<boolean>`(${attachments.analysis} is not null and ${attachments.plot} is not null)` })
        .from(attachments)
        .where(and(inArray(attachments.runVersionId, versions.map((v) => v.versionId)), eq(attachments.active, true), eq(attachments.kind, "series")))
    : [];
  const analysed = rows.filter((r) => r.analysed);
  return {
    labels: versions.filter((v) => analysed.some((r) => r.runVersionId === v.versionId)).map((v) => v.label),
    analysing: analysed.length < rows.length,
    overlayKey: analysed.map((r) => r.id).sort().join(","),
  };
}

/** The series of several run versions in one query, column-wise for a claim's plots route (its runs overlaid). */
export async function claimOverlayColumns(db: Database, versions: { versionId: string; label: string; record: unknown }[]): Promise<ClaimOverlayColumns> {
  const rows = await plotFiles(db, versions.map((v) => v.versionId), ["series"]);
  const plots = versions.map((v) => ({ label: v.label, ...plotsOf(rows.filter((r) => r.runVersionId === v.versionId), v.record as RunRecord) }));
  return encodeClaimOverlay({
    runs: plots.flatMap((p) => (p.series ? [{ label: p.label, plot: p.series }] : [])),
    analysing: plots.some((p) => p.analysing),
  });
}
