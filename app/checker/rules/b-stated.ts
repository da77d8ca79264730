/**
 * Family B: a claim's stated values against the recomputed ones, read with their
 * precision (see stated.ts). Run lengths route to D.stated-run-length, geometry to
 * H.stated-geometry, series averages to E.stated-average.
 */
import type { ClaimContext, RunContext } from "../context.ts";
import { lookup, lookupMaterial } from "../quantities.ts";
import { contains, describe, overlaps, parseStated, type Interval } from "../stated.ts";
import { flagOf, fmt, relDiff, type Flag, type RuleInfo } from "../types.ts";
import { RULES_D } from "./d-run-length.ts";
import { RULES_E } from "./e-series.ts";
import { RULES_H } from "./h-geometry.ts";

const SIG = "common practice (significant-figure reading of stated values)";

export const RULES_B = {
  value: {
    id: "B.stated-value", family: "B", title: "Stated value differs from the recomputed one",
    explanation: "A value stated in a claim must contain the recomputed value within its stated precision (3e-5 means [2.5e-5, 3.5e-5)).",
    severities: ["mismatch"], source: SIG,
  },
  material: {
    id: "B.stated-vs-material", family: "B", title: "Stated value differs from the one implied by material properties",
    explanation: "A stated control number must also agree with its recomputation from the run's material properties.",
    severities: ["mismatch"], source: SIG,
  },
  unverifiable: {
    id: "B.stated-unverifiable", family: "B", title: "Stated value cannot be recomputed",
    explanation: "The record lacks what is needed to recompute this stated value, so it is unchecked.",
    severities: ["note"], source: SIG,
  },
} satisfies Record<string, RuleInfo>;

function ruleFor(q: string): RuleInfo {
  if (q.startsWith("runLength.") || q.startsWith("averagingWindow.")) return RULES_D.stated;
  if (q === "layerThicknessKm" || q === "tangentCylinderLatitudeDeg" || q === "layerTangentLatitudeDeg") return RULES_H.stated;
  return RULES_B.value;
}

export function checkStated(cc: ClaimContext): Flag[] {
  const out: Flag[] = [];
  const rows = cc.claim.stated ?? [];
  rows.forEach((row, i) => {
    if (row.ratio || row.scalesWith !== undefined) return; // family K
    const iv = parseStated(row.value); // validated when the input was parsed
    const labels = row.run !== undefined ? [row.run] : cc.claim.runs.map((r) => r.label);
    for (const label of labels) {
      const ctx = cc.runs.get(label);
      if (ctx) out.push(...checkRow(ctx, row.quantity, iv, i, cc));
    }
  });
  return out;
}

function checkRow(ctx: RunContext, q: string, iv: Interval, row: number, cc: ClaimContext): Flag[] {
  const out: Flag[] = [];
  const extra = { run: ctx.label, claimRow: row };
  // A stated average is checked against the series whenever a series carries the column
  // (contract, family E); a diagnostics value that disagrees with it is flagged by E.diagnostic-vs-series.
  const col = ctx.series?.columns[q];
  if (col) {
    const z = cc.policy.zScore;
    const lo = col.mean - z * col.standardError;
    const hi = col.mean + z * col.standardError;
    if (!overlaps(iv, lo, hi)) {
      out.push(flagOf(RULES_E.stated, "mismatch", [q],
        `${ctx.label}: stated ${q} ${describe(iv)} but the attached series of ${q} averages ${fmt(col.mean)} ± ${fmt(col.standardError)} (standard error) after the transient; the stated interval misses mean ± ${fmt(z)} standard errors = [${fmt(lo)}, ${fmt(hi)}].`,
        { expected: col.mean, found: iv.text, tolerance: `${fmt(z)} standard errors = ${fmt(z * col.standardError)}`, ...extra }));
    }
    return out;
  }
  const v = lookup(ctx, q);
  if (v === undefined) {
    out.push(flagOf(RULES_B.unverifiable, "note", [q], `${ctx.label}: stated ${q} ${describe(iv)} cannot be recomputed from the record.`, { found: iv.text, ...extra }));
    return out;
  }
  if (!contains(iv, v)) {
    out.push(flagOf(ruleFor(q), "mismatch", [q], `${ctx.label}: stated ${q} ${describe(iv)} but the record gives ${fmt(v)}.`,
      { expected: v, found: iv.text, ...extra }));
  }
  const m = lookupMaterial(ctx, q);
  if (m !== undefined && relDiff(m, v) > 1e-9 && !contains(iv, m)) {
    out.push(flagOf(RULES_B.material, "mismatch", [q, "material"],
      `${ctx.label}: stated ${q} ${describe(iv)} but the material properties give ${fmt(m)}.`, { expected: m, found: iv.text, ...extra }));
  }
  return out;
}
