/** Every rule of the checker, for the help page and for tests. */
import { DEFAULT_POLICY } from "./policy.ts";
import { RULES_A } from "./rules/a-material.ts";
import { RULES_B } from "./rules/b-stated.ts";
import { RULES_C } from "./rules/c-identities.ts";
import { RULES_D } from "./rules/d-run-length.ts";
import { RULES_E } from "./rules/e-series.ts";
import { RULES_F } from "./rules/f-resolution.ts";
import { RULES_G } from "./rules/g-comparison.ts";
import { RULES_H } from "./rules/h-geometry.ts";
import { RULES_I } from "./rules/i-regime.ts";
import { RULES_J } from "./rules/j-benchmark.ts";
import { RULES_K } from "./rules/k-ratio-scaling.ts";
import type { Family, RuleInfo } from "./types.ts";

export interface RuleEntry extends RuleInfo {
  /** default value of `policyKey` */
  defaultThreshold?: unknown;
}

export const FAMILIES: Record<Family, string> = {
  A: "Control numbers from material properties",
  B: "Stated versus recomputed values",
  C: "Diagnostic identities",
  D: "Run length",
  E: "Time series",
  F: "Resolution",
  G: "Comparison claims",
  H: "Geometry",
  I: "Regime notes",
  J: "Benchmarks",
  K: "Ratio and scaling statements",
};

const all: RuleInfo[] = [RULES_A, RULES_B, RULES_C, RULES_D, RULES_E, RULES_F, RULES_G, RULES_H, RULES_I, RULES_J, RULES_K]
  .flatMap((group) => Object.values(group) as RuleInfo[]);

export const rules: RuleEntry[] = all
  .map((r) => {
    const e: RuleEntry = { ...r };
    if (r.policyKey !== undefined) e.defaultThreshold = (DEFAULT_POLICY as unknown as Record<string, unknown>)[r.policyKey];
    return e;
  })
  .sort((x, y) => (x.family === y.family ? 0 : x.family < y.family ? -1 : 1));

export function ruleById(id: string): RuleEntry | undefined {
  return rules.find((r) => r.id === id);
}
