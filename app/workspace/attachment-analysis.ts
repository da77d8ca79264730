/**
 * What Runproof keeps of an attached CSV besides the file itself: computed once when the
 * file arrives (or when the venue's MSER batch changes), then read by every check and page.
 */
import type { TypedColumns } from "~/checker/csv";
import { analyseSeries } from "~/checker/series";
import type { AttachmentAnalysis, AttachmentPlot } from "~db/schema";

/** Points per plotted column: enough for a 1,200-pixel-wide chart (LTTB keeps the shape). */
export const PLOT_POINTS = 600;

/**
 * Largest-triangle-three-buckets downsampling of (x, y) to at most `points` points (Steinarsson
 * 2013, "Downsampling time series for visual representation", §4.2), straight on typed arrays:
 * one pass, no per-point objects. Picks the same points as the `downsample` package's LTTB
 * (checked in unit/workspace/attachment-analysis.test.ts), several times faster on 200,000 rows.
 */
export function downsampleXY(x: ArrayLike<number>, y: ArrayLike<number>, points = PLOT_POINTS): { x: number; y: number }[] {
  const n = Math.min(x.length, y.length);
  if (n <= points || points < 3) return Array.from({ length: n }, (_, i) => ({ x: x[i]!, y: y[i]! }));
  const out: { x: number; y: number }[] = [{ x: x[0]!, y: y[0]! }];
  const every = (n - 2) / (points - 2);
  let a = 0;
  for (let i = 0; i < points - 2; i++) {
    // Average of the next bucket (the last point after the last bucket): the triangle's third corner.
    const nextStart = Math.floor((i + 1) * every) + 1;
    const nextEnd = Math.min(Math.floor((i + 2) * every) + 1, n);
    let avgX = 0;
    let avgY = 0;
    for (let j = nextStart; j < nextEnd; j++) {
      avgX += x[j]!;
      avgY += y[j]!;
    }
    const len = nextEnd - nextStart;
    avgX /= len;
    avgY /= len;
    // The point of this bucket spanning the largest triangle with the last kept point and that average.
    const start = Math.floor(i * every) + 1;
    const end = Math.floor((i + 1) * every) + 1;
    const ax = x[a]!;
    const ay = y[a]!;
    let maxArea = -1;
    let pick = start;
    for (let j = start; j < end; j++) {
      const area = Math.abs((ax - avgX) * (y[j]! - ay) - (ax - x[j]!) * (avgY - ay));
      if (area > maxArea) {
        maxArea = area;
        pick = j;
      }
    }
    out.push({ x: x[pick]!, y: y[pick]! });
    a = pick;
  }
  out.push({ x: x[n - 1]!, y: y[n - 1]! });
  return out;
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
