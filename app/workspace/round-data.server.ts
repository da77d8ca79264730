import { and, eq, inArray } from "drizzle-orm";
import { LTTB } from "downsample";
import type { Database } from "~db/client";
import { attachments, flags, storedFiles } from "~db/schema";
import { check } from "~/checker";
import type { RunRecord } from "~/checker/schema";
import { seriesSummary } from "~/checker/derive";
import { analyseSeries } from "~/checker/series";
import type { Derived } from "~/checker/types";
import { loadRoundInputs } from "./recheck.server";
import type { RunRow, SeriesPlot, SpectrumPlot } from "./views";

export type { RunRow, SeriesPlot, SpectrumPlot };


const n = (v: number | undefined) => (v === undefined || !Number.isFinite(v) ? null : v);

/** The runs table of a round: key controls, derived numbers (recomputed by the checker) and flag counts. */
export async function roundRunRows(db: Database, roundId: string): Promise<RunRow[]> {
  const inputs = await loadRoundInputs(db, roundId);
  if (!inputs.runs.length) return [];
  const derived = new Map<string, Derived>();
  try {
    for (const r of check({ runs: inputs.runs, series: inputs.series, spectra: inputs.spectra }).runs) derived.set(r.label, r.derived);
  } catch {
    // Stored records were validated on the way in; a checker upgrade that rejects one leaves the columns blank.
  }
  const counts = await db.select({ run: flags.runLabel, severity: flags.severity }).from(flags).where(eq(flags.roundId, roundId));
  return inputs.runRows.map((r) => {
    const d = derived.get(r.label) ?? {};
    const mine = counts.filter((c) => c.run === r.label);
    return {
      runId: r.runId,
      label: r.label,
      version: r.version,
      origin: r.origin,
      E: n(d.E),
      Ra: n(d.Ra),
      RaRotating: n(d.RaRotating),
      Pr: n(d.Pr),
      Pm: n(d.Pm),
      Rm: n(d.Rm),
      runLengthMagnetic: n(d.runLength?.magnetic),
      mismatch: mine.filter((c) => c.severity === "mismatch").length,
      caution: mine.filter((c) => c.severity === "caution").length,
      note: mine.filter((c) => c.severity === "note").length,
    };
  });
}


const MAX_POINTS = 600;

/** Plots of one run version: series downsampled (LTTB) for display; the window comes from every sample. */
export async function runPlots(db: Database, runVersionId: string, record: RunRecord) {
  const rows = await db
    .select({ id: attachments.id, kind: attachments.kind, data: attachments.data, rowCount: attachments.rowCount, filename: storedFiles.filename, size: storedFiles.size })
    .from(attachments)
    .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
    .where(and(eq(attachments.runVersionId, runVersionId), eq(attachments.active, true), inArray(attachments.kind, ["series", "spectrum"])));
  let series: SeriesPlot | null = null;
  let spectrum: SpectrumPlot | null = null;
  for (const a of rows) {
    if (a.kind === "series") {
      const stats = analyseSeries(a.data, 5);
      const t = a.data.t ?? [];
      const columns = Object.keys(a.data).filter((c) => c !== "t");
      const points: SeriesPlot["points"] = {};
      for (const c of columns) {
        const pairs = t.map((x, i) => ({ x, y: a.data[c]![i]! }));
        points[c] = pairs.length > MAX_POINTS ? (LTTB(pairs, MAX_POINTS) as { x: number; y: number }[]) : pairs;
      }
      series = { columns, points, tStart: stats?.tStart ?? 0, windowStart: stats?.windowStart ?? 0, tEnd: stats?.tEnd ?? 0, rows: a.rowCount, ...(stats ? { stats: seriesSummary(stats) } : {}) };
    } else {
      const l = a.data.l ?? [];
      const columns = Object.keys(a.data).filter((c) => c !== "l");
      spectrum = {
        columns,
        points: l.map((deg, i) => Object.fromEntries([["l", deg], ...columns.map((c) => [c, a.data[c]![i]!])]) as SpectrumPlot["points"][number]),
        truncationDegree: record.resolution?.maxDegree ?? l[l.length - 1] ?? 0,
      };
    }
  }
  const files = rows.map((a) => ({ id: a.id, kind: a.kind, filename: a.filename, rowCount: a.rowCount, size: a.size }));
  return { series, spectrum, files };
}
