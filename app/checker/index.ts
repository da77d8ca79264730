/**
 * Runproof checker engine: a pure function from run records (+ claim, policy, series,
 * spectra) to derived quantities and flags. No I/O.
 */
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
import type { CheckInput } from "./schema.ts";
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
  const policy = resolvePolicy(input.policy);
  const contexts = input.runs.map((run, i) =>
    buildRunContext(run, i, policy, input.series?.[run.label], input.spectra?.[run.label]),
  );
  const runs = contexts.map((ctx) => ({
    label: ctx.label,
    derived: ctx.derived,
    flags: RUN_RULES.flatMap((rule) => rule(ctx)),
  }));
  let claimFlags: Flag[] = [];
  if (input.claim) {
    const cc: ClaimContext = { claim: input.claim, runs: new Map(contexts.map((c) => [c.label, c])), policy };
    claimFlags = [...checkComparison(cc), ...checkStated(cc), ...checkRatioScaling(cc)];
  }
  return { runs, claimFlags };
}
