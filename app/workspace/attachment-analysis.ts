/**
 * What Runproof keeps of an attached CSV besides the file itself: computed once when the
 * file arrives (or when the venue's MSER batch changes), then read by every check and page.
 */
import { createLTTB } from "downsample";
import type { TypedColumns } from "~/checker/csv";
import { analyseSeries } from "~/checker/series";
import type { AttachmentAnalysis, AttachmentPlot } from "~db/schema";

/** Points per plotted column: enough for a 1,200-pixel-wide chart (LTTB keeps the shape). */
export const PLOT_POINTS = 600;

const lttbByIndex = (x: Float64Array, y: Float64Array) => createLTTB<number>({ x: (i: number) => x[i]!, y: (i: number) => y[i]! });

/** Largest-triangle-three-buckets downsampling of (x, y) to at most `points` points. */
export function downsampleXY(x: Float64Array, y: Float64Array, points = PLOT_POINTS): { x: number; y: number }[] {
  const n = Math.min(x.length, y.length);
  if (n <= points) return Array.from({ length: n }, (_, i) => ({ x: x[i]!, y: y[i]! }));
  const index = new Uint32Array(n);
  for (let i = 0; i < n; i++) index[i] = i;
  const kept = lttbByIndex(x, y)(index as unknown as number[], points);
  return Array.from({ length: kept.length }, (_, k) => {
    const i = kept[k]!;
    return { x: x[i]!, y: y[i]! };
  });
}

/** The stored analysis and plot copy of one CSV (series: statistics per column; spectrum: its columns). */
export function analyseColumns(kind: "series" | "spectrum", cols: TypedColumns, batch: number): { analysis: AttachmentAnalysis; plot: AttachmentPlot } {
  const first = kind === "series" ? "t" : "l";
  const x = cols[first]!;
  const columns = Object.keys(cols).filter((c) => c !== first);
  const points: AttachmentPlot["points"] = {};
  for (const c of columns) points[c] = downsampleXY(x, cols[c]!);
  if (kind === "series") {
    return { analysis: { kind, batch, stats: analyseSeries(cols, batch) ?? null }, plot: { columns, points } };
  }
  // A spectrum has one row per degree (a few thousand at most): the checker's rules read all of it.
  const all: Record<string, number[]> = {};
  for (const [n, c] of Object.entries(cols)) all[n] = Array.from(c);
  return { analysis: { kind, columns: all }, plot: { columns, points } };
}
