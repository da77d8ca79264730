/**
 * Runproof checker engine: a pure function from run records (+ claim, policy, series,
 * spectra) to derived quantities and flags. No I/O.
 */
import { statedComparisons, type StatedComparison } from "./comparisons.ts";
import { buildRunContext, type ClaimContext, type RunContext } from "./context.ts";
import type { InputError } from "./paths.ts";
import { policySchema, resolvePolicy } from "./policy.ts";
import { zodErrors } from "./paths.ts";
import { checkMaterial } from "./rules/a-material.ts";
import { checkStated } from "./rules/b-stated.ts";
import { checkIdentities } from "./rules/c-identities.ts";
import { checkRunLength } from "./rules/d-run-length.ts";
import { checkSeries } from "./rules/e-series.ts";
import { checkResolution } from "./rules/f-resolution.ts";
import { checkComparison } from "./rules/g-comparison.ts";
import { checkGeometry } from "./rules/h-geometry.ts";
import { checkRegime } from "./rules/i-regime.ts";
import { checkBenchmark } from "./rules/j-benchmark.ts";
import { checkRatioScaling } from "./rules/k-ratio-scaling.ts";
import { claimSchema, type CheckInput, type ClaimRecord, type Columns, type RunRecord } from "./schema.ts";
import type { SeriesStats } from "./series.ts";
import type { CheckOutput, Flag } from "./types.ts";
import { parseCheckInput } from "./validate.ts";

export { parseCheckInput, type ParseResult } from "./validate.ts";
export type { InputError } from "./paths.ts";
export type { CheckInput, RunRecord, ClaimRecord, Columns } from "./schema.ts";
export { runSchema, claimSchema, checkInputSchema } from "./schema.ts";
export type { CheckOutput, Derived, Flag, RuleInfo, RunResult, Severity } from "./types.ts";
export { rules, ruleById, FAMILIES } from "./registry.ts";
export { DEFAULT_POLICY, resolvePolicy, policySchema, type Policy, type PolicyOverrides } from "./policy.ts";
export { runJsonSchema, claimJsonSchema } from "./json-schema.ts";
export type { SeriesStats, ColumnStats } from "./series.ts";
export { statedComparisons, type StatedComparison, type StatedOutcome, type StoredInterval } from "./comparisons.ts";

/** Thrown by `check` for invalid input; `errors` carry JSON paths. */
export class CheckInputError extends Error {
  readonly errors: InputError[];
  constructor(errors: InputError[]) {
    super(errors.map((e) => `${e.path}: ${e.message}`).join("\n"));
    this.name = "CheckInputError";
    this.errors = errors;
  }
}

const RUN_RULES: Array<(c: RunContext) => Flag[]> = [
  checkMaterial, checkIdentities, checkRunLength, checkSeries, checkResolution, checkGeometry, checkRegime, checkBenchmark,
];

/** A claim's own rules, against run contexts built once. */
const claimRules = (cc: ClaimContext): Flag[] => [...checkComparison(cc), ...checkStated(cc), ...checkRatioScaling(cc)];

/** Validate and check. `policy` (optional) overrides `input.policy`. Throws CheckInputError. */
export function check(input: unknown, policy?: unknown): CheckOutput {
  const parsed = parseCheckInput(input);
  if (!parsed.ok) throw new CheckInputError(parsed.errors);
  let value = parsed.value;
  if (policy !== undefined) {
    const p = policySchema.safeParse(policy);
    if (!p.success) throw new CheckInputError(zodErrors(p.error, policy, ["policy"]));
    value = { ...value, policy: { ...value.policy, ...p.data } };
  }
  return checkParsed(value);
}

/** Check an input that `parseCheckInput` already accepted. */
export function checkParsed(input: CheckInput): CheckOutput {
  return checkContexts(input, resolvePolicy(input.policy), (run, i, policy) =>
    buildRunContext(run, i, policy, input.series?.[run.label], input.spectra?.[run.label]),
  );
}

/**
 * Input of `checkPrepared`: stored run records (validated when stored), each series as its
 * statistics computed once on arrival (`analyseSeries` under the policy's MSER batch) and the
 * spectra's columns (short: one row per degree).
 */
export interface PreparedInput {
  runs: RunRecord[];
  claim?: ClaimRecord;
  policy?: unknown;
  seriesStats?: Record<string, SeriesStats>;
  spectra?: Record<string, Columns>;
}

/** Checks stored runs from their stored analyses: no series is read or analysed again. */
export function checkPrepared(input: PreparedInput): CheckOutput {
  const p = policySchema.safeParse(input.policy ?? {});
  if (!p.success) throw new CheckInputError(zodErrors(p.error, input.policy, ["policy"]));
  const claim = input.claim;
  return checkContexts({ runs: input.runs, ...(claim ? { claim } : {}) }, resolvePolicy(p.data), (run, i, policy) =>
    buildRunContext(run, i, policy, undefined, input.spectra?.[run.label], input.seriesStats?.[run.label]),
  );
}

/** Thrown by `checkPreparedRound` when one claim cannot be checked: which claim (index), and why. */
export class ClaimCheckError extends Error {
  constructor(
    readonly claimIndex: number,
    readonly inner: unknown,
  ) {
    super(`claims[${claimIndex}]: ${inner instanceof Error ? inner.message : String(inner)}`);
    this.name = "ClaimCheckError";
  }
}

/**
 * A whole round from stored analyses: every run's context built once, then each claim's flags
 * against those contexts (a claim needs no run rule again). `claimFlags[i]` belongs to `claims[i]`,
 * and so does `claimComparisons[i]` (each stated value beside what it was checked against).
 * Stored records are validated again under the current schema (a stricter checker may refuse a
 * record stored earlier): runs throw CheckInputError, a claim throws ClaimCheckError.
 */
export function checkPreparedRound(input: PreparedInput & { claims: ClaimRecord[] }): { runs: CheckOutput["runs"]; claimFlags: Flag[][]; claimComparisons: StatedComparison[][] } {
  const p = policySchema.safeParse(input.policy ?? {});
  if (!p.success) throw new CheckInputError(zodErrors(p.error, input.policy, ["policy"]));
  const policy = resolvePolicy(p.data);
  if (!input.runs.length && !input.claims.length) return { runs: [], claimFlags: [], claimComparisons: [] };
  const parsedRuns = input.runs.length ? parseCheckInput({ runs: input.runs }) : ({ ok: true, value: { runs: [] } } as const);
  if (!parsedRuns.ok) throw new CheckInputError(parsedRuns.errors);
  const contexts = parsedRuns.value.runs.map((run, i) =>
    buildRunContext(run, i, policy, undefined, input.spectra?.[run.label], input.seriesStats?.[run.label]),
  );
  const runs = contexts.map((ctx) => ({ label: ctx.label, derived: ctx.derived, flags: RUN_RULES.flatMap((rule) => rule(ctx)) }));
  const byLabel = new Map(contexts.map((c) => [c.label, c]));
  const claimComparisons: StatedComparison[][] = [];
  const claimFlags = input.claims.map((raw, i) => {
    try {
      const c = claimSchema.safeParse(raw);
      if (!c.success) throw new CheckInputError(zodErrors(c.error, raw, ["claim"]));
      const cc = { claim: c.data, runs: byLabel, policy };
      claimComparisons.push(statedComparisons(cc));
      return claimRules(cc);
    } catch (e) {
      throw new ClaimCheckError(i, e);
    }
  });
  return { runs, claimFlags, claimComparisons };
}

function checkContexts(
  input: { runs: RunRecord[]; claim?: ClaimRecord },
  policy: ReturnType<typeof resolvePolicy>,
  build: (run: RunRecord, i: number, policy: ReturnType<typeof resolvePolicy>) => RunContext,
): CheckOutput {
  const contexts = input.runs.map((run, i) => build(run, i, policy));
  const runs = contexts.map((ctx) => ({
    label: ctx.label,
    derived: ctx.derived,
    flags: RUN_RULES.flatMap((rule) => rule(ctx)),
  }));
  let claimFlags: Flag[] = [];
  if (input.claim) {
    const cc: ClaimContext = { claim: input.claim, runs: new Map(contexts.map((c) => [c.label, c])), policy };
    claimFlags = claimRules(cc);
  }
  return { runs, claimFlags };
}
