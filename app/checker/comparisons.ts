/**
 * Each stated value of a claim beside the number it was checked against, with the interval
 * read from its precision (family B rules, stated.ts) and the outcome, for the claim page.
 * The same reading and the same comparisons as the flag rules (b-stated.ts, k-ratio-scaling.ts):
 * a "differs" here is exactly a mismatch flag there (unit/checker/comparisons.test.ts).
 */
import type { ClaimContext, RunContext } from "./context.ts";
import { fitPowerLaw } from "./power-law.ts";
import { lookup, lookupMaterial } from "./quantities.ts";
import { contains, overlaps, parseStated, type Interval } from "./stated.ts";
import { comparableValue, scalingPoints } from "./rules/k-ratio-scaling.ts";
import { relDiff } from "./types.ts";

export type StatedOutcome = "agrees" | "differs" | "unverifiable" | "undecided";

/** An interval as stored (JSON has no infinities: an open end is null). */
export interface StoredInterval {
  lo: number | null;
  hi: number | null;
  loInclusive: boolean;
  hiInclusive: boolean;
}

export interface StatedComparison {
  /** index into `claim.stated` */
  row: number;
  quantity: string;
  kind: "value" | "ratio" | "scaling";
  /** the run the value was checked for (the first run of a ratio; none for a scaling) */
  run: string | null;
  /** the stated value as the author wrote it */
  stated: string;
  /** the interval the stated value stands for */
  interval: StoredInterval;
  /** what it was checked against: the record's value, the material's, a series mean ± z SE, a ratio, a fitted exponent ± 2 SE */
  against: { source: "record" | "material" | "series" | "ratio" | "exponent"; value: number; lo?: number; hi?: number } | null;
  /** words for `against` when nothing could be recomputed, or for the fit */
  note?: string;
  outcome: StatedOutcome;
}

const stored = (iv: Interval): StoredInterval => ({
  lo: Number.isFinite(iv.lo) ? iv.lo : null,
  hi: Number.isFinite(iv.hi) ? iv.hi : null,
  loInclusive: iv.loInclusive,
  hiInclusive: iv.hiInclusive,
});

/** Every stated row of the claim, per run it applies to, with its outcome. */
export function statedComparisons(cc: ClaimContext): StatedComparison[] {
  const out: StatedComparison[] = [];
  (cc.claim.stated ?? []).forEach((row, i) => {
    const iv = parseStated(row.value);
    const base = { row: i, quantity: row.quantity, stated: String(row.value), interval: stored(iv) };
    if (row.ratio) {
      out.push(ratioRow(cc, row.quantity, row.ratio, iv, base));
      return;
    }
    if (row.scalesWith !== undefined) {
      out.push(scalingRow(cc, row.quantity, row.scalesWith, iv, base));
      return;
    }
    const labels = row.run !== undefined ? [row.run] : cc.claim.runs.map((r) => r.label);
    for (const label of labels) {
      const ctx = cc.runs.get(label);
      if (ctx) out.push(...valueRows(ctx, row.quantity, iv, cc, base));
    }
  });
  return out;
}

type Base = Pick<StatedComparison, "row" | "quantity" | "stated" | "interval">;

function valueRows(ctx: RunContext, q: string, iv: Interval, cc: ClaimContext, base: Base): StatedComparison[] {
  const at = { ...base, kind: "value" as const, run: ctx.label };
  const col = ctx.series?.columns[q];
  if (col) {
    const z = cc.policy.zScore;
    const lo = col.mean - z * col.standardError;
    const hi = col.mean + z * col.standardError;
    return [{ ...at, against: { source: "series", value: col.mean, lo, hi }, outcome: overlaps(iv, lo, hi) ? "agrees" : "differs" }];
  }
  const v = lookup(ctx, q);
  if (v === undefined) return [{ ...at, against: null, note: "cannot be recomputed from the record", outcome: "unverifiable" }];
  const rows: StatedComparison[] = [{ ...at, against: { source: "record", value: v }, outcome: contains(iv, v) ? "agrees" : "differs" }];
  const m = lookupMaterial(ctx, q);
  if (m !== undefined && relDiff(m, v) > 1e-9) rows.push({ ...at, against: { source: "material", value: m }, outcome: contains(iv, m) ? "agrees" : "differs" });
  return rows;
}

function ratioRow(cc: ClaimContext, q: string, [a, b]: [string, string], iv: Interval, base: Base): StatedComparison {
  const at = { ...base, kind: "ratio" as const, run: a, quantity: `${q}(${a})/${q}(${b})` };
  const ca = cc.runs.get(a);
  const cb = cc.runs.get(b);
  const va = ca && comparableValue(ca, q);
  const vb = cb && comparableValue(cb, q);
  if (va === undefined || vb === undefined || vb === 0) return { ...at, against: null, note: "a run of the ratio lacks the quantity", outcome: "unverifiable" };
  const r = va / vb;
  return { ...at, against: { source: "ratio", value: r }, outcome: contains(iv, r) ? "agrees" : "differs" };
}

function scalingRow(cc: ClaimContext, q: string, x: string, iv: Interval, base: Base): StatedComparison {
  const at = { ...base, kind: "scaling" as const, run: null, quantity: `exponent of ${q} ∝ ${x}^b` };
  const { xs, ys } = scalingPoints(cc, q, x);
  const fit = fitPowerLaw(xs, ys);
  if (xs.length < 3 || !fit || fit.standardError === undefined || fit.span < 3) {
    return { ...at, against: fit ? { source: "exponent", value: fit.exponent } : null, note: "too few runs or too narrow a range to decide", outcome: "undecided" };
  }
  const lo = fit.exponent - 2 * fit.standardError;
  const hi = fit.exponent + 2 * fit.standardError;
  return { ...at, against: { source: "exponent", value: fit.exponent, lo, hi }, outcome: overlaps(iv, lo, hi) ? "agrees" : "differs" };
}
