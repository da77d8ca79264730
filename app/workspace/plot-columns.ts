/**
 * A run's plot copies as they travel to the browser: column-wise arrays of numbers instead of one
 * object per point. `{x, y}` objects repeat their keys at every point and cost the server an
 * object each to encode; plain arrays are a third of the bytes and cheap to write. The charts
 * still take points (`SeriesPlot`, `SpectrumPlot`), so the browser turns the arrays back.
 * Pure: shared by the server (encode) and the charts (decode).
 */
import type { SeriesPlot, SpectrumPlot } from "./view-types";

/**
 * A time series: per column the times and the values of its downsampled copy. Each column is
 * downsampled on its own (LTTB keeps different rows per column), so the times can differ; when
 * every column has the same times (a short file, kept whole) they are sent once as an array.
 */
export type SeriesColumns = Omit<SeriesPlot, "points"> & { x: number[] | Record<string, number[]>; y: Record<string, number[]> };
/** A spectrum: the degrees once, and the energy per degree of each column. */
export type SpectrumColumns = Omit<SpectrumPlot, "points"> & { l: number[]; y: Record<string, number[]> };
/** What the plots route answers for one run (`analysing`: a file of it is not analysed yet). */
export type RunPlotColumns = { series: SeriesColumns | null; spectrum: SpectrumColumns | null; analysing: boolean };
/** The same with points, as the charts take them. */
export type RunPlotPoints = { series: SeriesPlot | null; spectrum: SpectrumPlot | null; analysing: boolean };

const sameNumbers = (a: number[], b: number[]) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

export function encodeSeries(plot: SeriesPlot): SeriesColumns {
  const { points, ...rest } = plot;
  const x: Record<string, number[]> = {};
  const y: Record<string, number[]> = {};
  for (const [c, pts] of Object.entries(points)) {
    x[c] = pts.map((p) => p.x);
    y[c] = pts.map((p) => p.y);
  }
  const all = Object.values(x);
  const shared = all.length > 0 && all.every((xs) => sameNumbers(xs, all[0]!));
  return { ...rest, x: shared ? all[0]! : x, y };
}

export function decodeSeries(columns: SeriesColumns): SeriesPlot {
  const { x, y, ...rest } = columns;
  const points: SeriesPlot["points"] = {};
  for (const [c, ys] of Object.entries(y)) {
    const xs = Array.isArray(x) ? x : (x[c] ?? []);
    points[c] = ys.map((v, i) => ({ x: xs[i]!, y: v }));
  }
  return { ...rest, points };
}

export function encodeSpectrum(plot: SpectrumPlot): SpectrumColumns {
  const { points, ...rest } = plot;
  const y: Record<string, number[]> = {};
  for (const c of plot.columns) y[c] = points.map((p) => p[c]!);
  return { ...rest, l: points.map((p) => p.l), y };
}

export function decodeSpectrum(columns: SpectrumColumns): SpectrumPlot {
  const { l, y, ...rest } = columns;
  const points = l.map((degree, i) => Object.fromEntries([["l", degree], ...rest.columns.map((c) => [c, y[c]![i]!])]) as SpectrumPlot["points"][number]);
  return { ...rest, points };
}

export function encodeRunPlots(plots: RunPlotPoints): RunPlotColumns {
  return { series: plots.series && encodeSeries(plots.series), spectrum: plots.spectrum && encodeSpectrum(plots.spectrum), analysing: plots.analysing };
}

export function decodeRunPlots(plots: RunPlotColumns): RunPlotPoints {
  return { series: plots.series && decodeSeries(plots.series), spectrum: plots.spectrum && decodeSpectrum(plots.spectrum), analysing: plots.analysing };
}

/** What a claim's plots route answers: the series of the claim's runs, one per run, to overlay (`analysing`: a series file of them is not analysed yet). */
export type ClaimOverlayColumns = { runs: { label: string; series: SeriesColumns }[]; analysing: boolean };
/** The same with points, as the comparison chart takes them. */
export type ClaimOverlayPoints = { runs: { label: string; plot: SeriesPlot }[]; analysing: boolean };

export function encodeClaimOverlay(overlay: ClaimOverlayPoints): ClaimOverlayColumns {
  return { runs: overlay.runs.map((r) => ({ label: r.label, series: encodeSeries(r.plot) })), analysing: overlay.analysing };
}

export function decodeClaimOverlay(overlay: ClaimOverlayColumns): ClaimOverlayPoints {
  return { runs: overlay.runs.map((r) => ({ label: r.label, plot: decodeSeries(r.series) })), analysing: overlay.analysing };
}
