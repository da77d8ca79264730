/** Everything the rules of one run need, computed once. */
import { derive, givenValues, type Given } from "./derive.ts";
import { materialToSI, recompute, type MaterialSI, type Recomputed } from "./material.ts";
import type { Policy } from "./policy.ts";
import type { ClaimRecord, Columns, RunRecord } from "./schema.ts";
import { analyseSeries, type SeriesStats } from "./series.ts";
import type { Derived } from "./types.ts";

export interface RunContext {
  run: RunRecord;
  label: string;
  /** JSON path of the run in the input, e.g. "runs[1]" */
  path: string;
  policy: Policy;
  material: MaterialSI;
  recomputed: Recomputed;
  given: Given;
  series?: SeriesStats;
  seriesColumns?: Columns;
  spectrum?: Columns;
  derived: Derived;
  magnetic: boolean;
}

export function buildRunContext(
  run: RunRecord,
  index: number,
  policy: Policy,
  seriesColumns?: Columns,
  spectrum?: Columns,
): RunContext {
  const path = `runs[${index}]`;
  const { values: material } = materialToSI(run.material, `${path}.material`);
  const recomputed = recompute(material, run);
  const series = seriesColumns ? analyseSeries(seriesColumns, policy.mserBatch) : undefined;
  const given = givenValues(run, series);
  const derived = derive(run, recomputed, given, series, policy, material.outerRadius);
  const ctx: RunContext = {
    run,
    label: run.label,
    path,
    policy,
    material,
    recomputed,
    given,
    derived,
    magnetic: derived.Pm !== undefined,
  };
  if (series) ctx.series = series;
  if (seriesColumns) ctx.seriesColumns = seriesColumns;
  if (spectrum) ctx.spectrum = spectrum;
  return ctx;
}

export interface ClaimContext {
  claim: ClaimRecord;
  runs: Map<string, RunContext>;
  policy: Policy;
}
