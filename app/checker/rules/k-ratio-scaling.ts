/**
 * Family K: ratio statements (`ratio: [a, b]`, quantity of run a over that of run b) and
 * scaling statements (`scalesWith`, the exponent b of log y = a + b·log x over the claim's
 * runs). Dimensionless numbers are compared in the canonical convention (gap, f = 1), so
 * runs declared in different conventions are still comparable.
 */
import type { ClaimContext, RunContext } from "../context.ts";
import { CANONICAL, convert, SCALING, type Scaled } from "../conventions.ts";
import { fitPowerLaw } from "../power-law.ts";
import { lookup } from "../quantities.ts";
import { contains, describe, overlaps, parseStated } from "../stated.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const OLS = "ordinary least squares on logarithms, standard error from the residuals (any statistics handbook)";
const SIG = "common practice (significant-figure reading of stated values)";

export const RULES_K = {
  ratio: {
    id: "K.stated-ratio", family: "K", title: "Stated ratio between two runs differs",
    explanation: "A stated ratio (quantity of the first run over that of the second) must contain the recomputed ratio within its stated precision.",
    severities: ["mismatch"], source: SIG,
  },
  exponent: {
    id: "K.stated-exponent", family: "K", title: "Stated scaling exponent differs from the fit",
    explanation: "A stated exponent of y ∝ x^b over the claim's runs must overlap the least-squares exponent ± 2 standard errors.",
    severities: ["mismatch"], threshold: "stated interval and b ± 2·SE(b) do not overlap", source: OLS,
  },
  undecided: {
    id: "K.fit-undecided", family: "K", title: "Too few runs or too narrow a range to fit a scaling",
    explanation: "A power-law exponent needs at least three runs spanning at least a factor 3 in x; with less, the fit cannot decide.",
    severities: ["caution"], threshold: "fewer than 3 runs, or x spanning less than a factor 3", source: OLS,
  },
  unverifiable: {
    id: "K.unverifiable", family: "K", title: "Ratio or scaling cannot be recomputed",
    explanation: "A run of the statement lacks the quantity (or has a zero or negative value where a logarithm is needed), so the statement is unchecked.",
    severities: ["note"], source: SIG,
  },
} satisfies Record<string, RuleInfo>;

/** The value of q for one run: the series mean when a series carries it, else the record's; canonical convention. */
export function comparableValue(ctx: RunContext, q: string): number | undefined {
  const v = ctx.series?.columns[q]?.mean ?? lookup(ctx, q);
  if (v === undefined) return undefined;
  if (q in SCALING) return convert(q as Scaled, v, ctx.run.conventions, CANONICAL, ctx.run.geometry.radiusRatio);
  return v;
}

/**
 * The points of a scaling statement q ∝ x^b: each claim run with both quantities known and
 * positive (a power law is fitted in logs), and the runs left out.
 */
export function scalingPoints(cc: ClaimContext, q: string, x: string) {
  const used: string[] = [];
  const skipped: string[] = [];
  const xs: number[] = [];
  const ys: number[] = [];
  for (const { label } of cc.claim.runs) {
    const ctx = cc.runs.get(label);
    const vx = ctx && comparableValue(ctx, x);
    const vy = ctx && comparableValue(ctx, q);
    if (vx !== undefined && vy !== undefined && vx > 0 && vy > 0) {
      used.push(label);
      xs.push(vx);
      ys.push(vy);
    } else skipped.push(label);
  }
  return { used, skipped, xs, ys };
}

export function checkRatioScaling(cc: ClaimContext): Flag[] {
  const out: Flag[] = [];
  (cc.claim.stated ?? []).forEach((row, i) => {
    if (row.ratio) out.push(...checkRatio(cc, row.quantity, row.ratio, row.value, i));
    else if (row.scalesWith !== undefined) out.push(...checkScaling(cc, row.quantity, row.scalesWith, row.value, i));
  });
  return out;
}

function checkRatio(cc: ClaimContext, q: string, [a, b]: [string, string], value: string | number, row: number): Flag[] {
  const iv = parseStated(value); // validated with the claim
  const ca = cc.runs.get(a);
  const cb = cc.runs.get(b);
  const va = ca && comparableValue(ca, q);
  const vb = cb && comparableValue(cb, q);
  const extra = { run: a, claimRow: row };
  if (va === undefined || vb === undefined || vb === 0) {
    const missing = [va === undefined ? a : null, vb === undefined ? b : null].filter(Boolean).join(" and ");
    return [flagOf(RULES_K.unverifiable, "note", [q], `Stated ${q}(${a})/${q}(${b}) ${describe(iv)} cannot be recomputed: ${missing ? `${q} is unknown for ${missing}` : `${q}(${b}) is 0`}.`, { found: iv.text, ...extra })];
  }
  const r = va / vb;
  if (contains(iv, r)) return [];
  return [flagOf(RULES_K.ratio, "mismatch", [q], `Stated ${q}(${a})/${q}(${b}) ${describe(iv)} but the runs give ${fmt(va)}/${fmt(vb)} = ${fmt(r)}.`,
    { expected: r, found: iv.text, tolerance: "the stated value's precision", ...extra })];
}

function checkScaling(cc: ClaimContext, q: string, x: string, value: string | number, row: number): Flag[] {
  const iv = parseStated(value);
  const out: Flag[] = [];
  const { used, skipped, xs, ys } = scalingPoints(cc, q, x);
  const extra = { claimRow: row };
  if (skipped.length > 0) {
    out.push(flagOf(RULES_K.unverifiable, "note", [q, x],
      `The scaling of ${q} with ${x} leaves out ${skipped.join(", ")}: ${q} or ${x} is unknown there (or not positive).`, { ...extra }));
  }
  const fit = fitPowerLaw(xs, ys);
  if (used.length < 3 || !fit || fit.standardError === undefined || fit.span < 3) {
    const why = used.length < 3 ? `only ${used.length} run(s) (${used.join(", ") || "none"}) carry both quantities; a fit needs at least 3` : `${x} spans only a factor ${fmt(fit?.span ?? 1)} over the runs; a fit needs at least a factor 3`;
    out.push(flagOf(RULES_K.undecided, "caution", [q, x],
      `The stated exponent of ${q} ∝ ${x}^b ${describe(iv)} cannot be decided: ${why}.`,
      { found: iv.text, ...(fit ? { expected: fit.exponent } : {}), ...extra }));
    return out;
  }
  const se = fit.standardError;
  const lo = fit.exponent - 2 * se;
  const hi = fit.exponent + 2 * se;
  if (!overlaps(iv, lo, hi)) {
    out.push(flagOf(RULES_K.exponent, "mismatch", [q, x],
      `Over ${used.length} runs (${used.join(", ")}) ${q} ∝ ${x}^b fits b = ${fmt(fit.exponent)} ± ${fmt(se)} (standard error); b ± 2 SE = [${fmt(lo)}, ${fmt(hi)}] misses the stated ${describe(iv)}.`,
      { expected: fit.exponent, found: iv.text, tolerance: `2 standard errors = ${fmt(2 * se)}`, ...extra }));
  }
  return out;
}
