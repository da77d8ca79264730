/** Family E: transient, stationarity and effective sample size of attached time series. */
import type { RunContext } from "../context.ts";
import { flagOf, fmt, relativeTolerance, type Flag, type RuleInfo } from "../types.ts";

const MSER = "MSER-5, White 1997 (Simulation 69, 323–334); White, Cobb & Spratt 2000";

export const RULES_E = {
  transient: {
    id: "E.transient", family: "E", title: "Initial transient found and discarded",
    explanation: "MSER-5 locates the end of the initial transient; statistics use only the rows after it.",
    severities: ["note"], policyKey: "mserBatch", threshold: "batch size policy.mserBatch (default 5)", source: MSER,
  },
  transientLong: {
    id: "E.transient-long", family: "E", title: "Transient may last the whole series",
    explanation: "When MSER-5's minimum falls at its search limit (half the series) the run may not have reached a statistically steady state.",
    severities: ["caution"], source: MSER,
  },
  stationarity: {
    id: "E.stationarity", family: "E", title: "Means of the two halves differ",
    explanation: "After the transient, the means of the first and second halves should agree within their batch-means standard errors.",
    severities: ["caution"], policyKey: "zScore", threshold: "|z| above policy.zScore (default 3)",
    source: "two-halves test in the spirit of Geweke 1992 (Bayesian Statistics 4); batch means standard errors",
  },
  ess: {
    id: "E.effective-samples", family: "E", title: "Few effectively independent samples",
    explanation: "The effective sample size n/τ_int (integrated autocorrelation time) should be large enough for a meaningful mean.",
    severities: ["caution"], policyKey: "minEffectiveSamples", threshold: "effective sample size below policy.minEffectiveSamples (default 10)",
    source: "integrated autocorrelation time with automatic windowing, Sokal 1997",
  },
  diagnosticVsSeries: {
    id: "E.diagnostic-vs-series", family: "E", title: "Diagnostic value differs from the series mean",
    explanation: "A diagnostic given in the record must agree with the mean of the same column of its attached series (after the transient) within the larger of the policy tolerance and 3 standard errors.",
    severities: ["mismatch"], policyKey: "identityTolerance",
    threshold: "difference above max(policy.identityTolerance × |mean| (default 2 % relative), policy.zScore (default 3) standard errors)",
    source: "batch means standard error; MSER-5 truncation (White 1997)",
  },
  stated: {
    id: "E.stated-average", family: "E", title: "Stated average differs from the series mean",
    explanation: "A claim's stated average must overlap the series mean ± policy.zScore standard errors.",
    severities: ["mismatch"], policyKey: "zScore", threshold: "interval misses mean ± policy.zScore (default 3) × standard error",
    source: "batch means standard error; MSER-5 truncation (White 1997)",
  },
} satisfies Record<string, RuleInfo>;

export function checkSeries(ctx: RunContext): Flag[] {
  const s = ctx.series;
  if (!s) return [];
  const out: Flag[] = [];
  const p = ctx.policy;
  const label = ctx.label;
  const cut = Object.values(s.columns).filter((c) => c.truncationIndex > 0 && !c.truncationAtLimit);
  if (cut.length > 0) {
    const parts = cut.map((c) => `${c.column} at t = ${fmt(c.truncationTime)} (${c.truncationIndex} rows)`);
    out.push(flagOf(RULES_E.transient, "note", cut.map((c) => `series.${c.column}`),
      `${label}: MSER-5 puts the end of the initial transient of ${parts.join(", ")}; statistics use the rows after it.`,
      { found: Math.max(...cut.map((c) => c.truncationTime)), run: label }));
  }
  for (const c of Object.values(s.columns)) {
    const q = [`series.${c.column}`];
    if (c.truncationAtLimit) {
      out.push(flagOf(RULES_E.transientLong, "caution", q,
        `${label}: MSER-5 puts the end of the transient of ${c.column} at t = ${fmt(c.truncationTime)}, its search limit (half the series); the series may still be drifting.`,
        { found: c.truncationTime, run: label }));
    }
    if (Math.abs(c.z) > p.zScore) {
      out.push(flagOf(RULES_E.stationarity, "caution", q,
        `${label}: the two halves of ${c.column} after the transient differ by z = ${fmt(c.z)} standard errors.`,
        { found: c.z, tolerance: `|z| ≤ ${fmt(p.zScore)}`, run: label }));
    }
    if (c.ess < p.minEffectiveSamples) {
      out.push(flagOf(RULES_E.ess, "caution", q,
        `${label}: ${c.column} has ${fmt(c.ess)} effectively independent samples (τ_int = ${fmt(c.tau)} rows over ${c.n} rows).`,
        { expected: `≥ ${p.minEffectiveSamples}`, found: c.ess, run: label }));
    }
    const d = (ctx.run.diagnostics as Record<string, number | undefined> | undefined)?.[c.column];
    if (d !== undefined) {
      const diff = Math.abs(d - c.mean);
      const byTol = p.identityTolerance * Math.abs(c.mean);
      const bySe = p.zScore * c.standardError;
      const allowed = Math.max(byTol, bySe);
      if (diff > allowed) {
        const which = byTol >= bySe ? `${relativeTolerance(p.identityTolerance)}, = ${fmt(byTol)}` : `${fmt(p.zScore)} standard errors, = ${fmt(bySe)}`;
        out.push(flagOf(RULES_E.diagnosticVsSeries, "mismatch", [c.column, `series.${c.column}`],
          `${label}: diagnostics.${c.column} = ${fmt(d)} but the attached series of ${c.column} averages ${fmt(c.mean)} ± ${fmt(c.standardError)} (standard error) after the transient; they differ by ${fmt(diff)}, more than the tolerance (${which}).`,
          { expected: c.mean, found: d, tolerance: `max(${relativeTolerance(p.identityTolerance)}, ${fmt(p.zScore)} standard errors) = ${fmt(allowed)}`, run: label }));
      }
    }
  }
  return out;
}
