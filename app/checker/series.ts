/** Statistics of one run's attached time series, column by column (family E). */
import { batchMeansSE, effectiveSampleSize, integratedAutocorrelationTime, mean, mser, part, twoHalvesZ, type Values } from "./stats.ts";

export interface ColumnStats {
  column: string;
  /** rows kept after the transient */
  n: number;
  truncationIndex: number;
  truncationTime: number;
  /** MSER's minimum fell at its search limit (half the series): the transient may be longer */
  truncationAtLimit: boolean;
  mean: number;
  standardError: number;
  z: number;
  tau: number;
  ess: number;
}

export interface SeriesStats {
  tStart: number;
  tEnd: number;
  /** median sampling interval of t */
  dt: number;
  /** rows of the series */
  rows: number;
  /** latest truncation time over all columns: start of the averaging window */
  windowStart: number;
  columns: Record<string, ColumnStats>;
}

/** Median of the steps of an increasing t. */
export function medianStep(t: Values): number {
  const n = t.length;
  if (n < 2) return 0;
  const steps = new Float64Array(n - 1);
  for (let i = 1; i < n; i++) steps[i - 1] = t[i]! - t[i - 1]!;
  steps.sort();
  return steps[Math.floor(steps.length / 2)] ?? 0;
}

/**
 * Analyses every column once: MSER truncation, then mean, batch-means standard error, the
 * two-halves z score and τ_int (one FFT) on the kept part, which is a view, not a copy.
 */
export function analyseSeries(cols: Record<string, Values>, batch: number): SeriesStats | undefined {
  const raw = cols.t;
  if (!raw || raw.length < 2) return undefined;
  const t = raw instanceof Float64Array ? raw : Float64Array.from(raw);
  const tStart = t[0] ?? 0;
  const tEnd = t[t.length - 1] ?? 0;
  const out: Record<string, ColumnStats> = {};
  let windowStart = tStart;
  for (const [name, values] of Object.entries(cols)) {
    if (name === "t") continue;
    const x = values instanceof Float64Array ? values : Float64Array.from(values);
    const { truncation, batches } = mser(x, batch);
    const kept = part(x, truncation);
    const truncationTime = t[truncation] ?? tStart;
    windowStart = Math.max(windowStart, truncationTime);
    const tau = integratedAutocorrelationTime(kept);
    out[name] = {
      column: name,
      n: kept.length,
      truncationIndex: truncation,
      truncationTime,
      truncationAtLimit: batches >= 4 && truncation === Math.floor(batches / 2) * batch && truncation > 0,
      mean: mean(kept),
      standardError: batchMeansSE(kept),
      z: twoHalvesZ(kept),
      tau,
      ess: effectiveSampleSize(kept, tau),
    };
  }
  return { tStart, tEnd, dt: medianStep(t), rows: t.length, windowStart, columns: out };
}
