/** Statistics of one run's attached time series, column by column (family E). */
import type { Columns } from "./schema.ts";
import { batchMeansSE, effectiveSampleSize, integratedAutocorrelationTime, mean, mser, twoHalvesZ } from "./stats.ts";

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
  /** latest truncation time over all columns: start of the averaging window */
  windowStart: number;
  columns: Record<string, ColumnStats>;
}

export function analyseSeries(cols: Columns, batch: number): SeriesStats | undefined {
  const t = cols.t;
  if (!t || t.length < 2) return undefined;
  const tStart = t[0] ?? 0;
  const tEnd = t[t.length - 1] ?? 0;
  const out: Record<string, ColumnStats> = {};
  let windowStart = tStart;
  for (const [name, x] of Object.entries(cols)) {
    if (name === "t") continue;
    const { truncation, batches } = mser(x, batch);
    const kept = x.slice(truncation);
    const truncationTime = t[truncation] ?? tStart;
    windowStart = Math.max(windowStart, truncationTime);
    out[name] = {
      column: name,
      n: kept.length,
      truncationIndex: truncation,
      truncationTime,
      truncationAtLimit: batches >= 4 && truncation === Math.floor(batches / 2) * batch && truncation > 0,
      mean: mean(kept),
      standardError: batchMeansSE(kept),
      z: twoHalvesZ(kept),
      tau: integratedAutocorrelationTime(kept),
      ess: effectiveSampleSize(kept),
    };
  }
  return { tStart, tEnd, windowStart, columns: out };
}
