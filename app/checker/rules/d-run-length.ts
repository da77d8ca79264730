/** Family D: run length in every time unit, against the venue's minimum and the series. */
import type { RunContext } from "../context.ts";
import { lengthInGaps } from "../conventions.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const CP = "common practice";

export const RULES_D = {
  minMagnetic: {
    id: "D.min-magnetic-times", family: "D", title: "Dynamo run shorter than the minimum in magnetic diffusion times",
    explanation: "A dynamo run should last at least the venue's minimum number of magnetic diffusion times, counted in gap units D²/η whatever length scale the run declares.",
    severities: ["caution"], policyKey: "minMagneticTimes", threshold: "run length in D²/η below policy.minMagneticTimes (default 1)", source: CP,
  },
  minOverturns: {
    id: "D.min-overturns", family: "D", title: "Non-magnetic run shorter than the minimum in overturns",
    explanation: "A non-magnetic run should last at least the venue's minimum number of overturn times, counted in gap units D/U whatever length scale the run declares.",
    severities: ["caution"], policyKey: "minOverturns", threshold: "run length in D/U below policy.minOverturns (default 10)", source: CP,
  },
  unknown: {
    id: "D.run-length-unknown", family: "D", title: "Run length cannot be computed",
    explanation: "Without time.start, time.end (and Pm or Re where needed) the run length against the minimum is unknown.",
    severities: ["note"], source: CP,
  },
  seriesSpan: {
    id: "D.series-span", family: "D", title: "Series time span differs from the declared run time",
    explanation: "An attached time series should cover the run's declared time.start to time.end.",
    severities: ["mismatch"], policyKey: "seriesSpanTolerance",
    threshold: "ends differ by more than policy.seriesSpanTolerance (default 2 %) of the run length, or 1.5 sampling intervals", source: CP,
  },
  stated: {
    id: "D.stated-run-length", family: "D", title: "Stated run length differs from the recomputed one",
    explanation: "A claim's stated run length must agree, within its stated precision, with the length recomputed from time and the control numbers.",
    severities: ["mismatch"], source: "common practice (significant-figure reading of stated values)",
  },
} satisfies Record<string, RuleInfo>;

/**
 * The venue's minimum is physical: the run length is converted to gap units (D²/η for
 * magnetic diffusion, D/U for overturns) before the comparison, so a run declared in
 * outer-radius units gets the verdict of the same run declared in gap units.
 */
export function gapRunLength(ctx: RunContext): { magnetic?: number; overturns?: number } {
  const rl = ctx.derived.runLength;
  const lg = lengthInGaps(ctx.run.conventions.lengthScale, ctx.run.geometry.radiusRatio);
  const out: { magnetic?: number; overturns?: number } = {};
  if (rl?.magnetic !== undefined) out.magnetic = rl.magnetic * lg * lg;
  if (rl?.overturns !== undefined) out.overturns = rl.overturns * lg;
  return out;
}

export function checkRunLength(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const rl = ctx.derived.runLength;
  const gap = gapRunLength(ctx);
  const p = ctx.policy;
  const label = ctx.label;
  const outer = ctx.run.conventions.lengthScale === "outer-radius";
  if (ctx.magnetic) {
    if (rl?.magnetic === undefined || gap.magnetic === undefined) {
      out.push(flagOf(RULES_D.unknown, "note", ["runLength.magnetic", "time"], `${label}: the run length in magnetic diffusion times is unknown; give time.start and time.end.`, { run: label }));
    } else if (gap.magnetic < p.minMagneticTimes) {
      const declared = outer ? `${fmt(rl.magnetic)} magnetic diffusion times r_o²/η, that is ${fmt(gap.magnetic)} D²/η` : `${fmt(gap.magnetic)} magnetic diffusion times D²/η`;
      out.push(flagOf(RULES_D.minMagnetic, "caution", ["runLength.magnetic"],
        `${label}: the run lasts ${declared}, below the venue's minimum of ${fmt(p.minMagneticTimes)} D²/η.`,
        { expected: `≥ ${fmt(p.minMagneticTimes)} D²/η`, found: `${fmt(gap.magnetic)} D²/η${outer ? ` (${fmt(rl.magnetic)} r_o²/η)` : ""}`, run: label }));
    }
  } else if (rl?.overturns === undefined || gap.overturns === undefined) {
    out.push(flagOf(RULES_D.unknown, "note", ["runLength.overturns", "time", "Re"],
      `${label}: the run length in overturn times is unknown; give time.start, time.end and Re (or kineticEnergy or a series).`, { run: label }));
  } else if (gap.overturns < p.minOverturns) {
    const declared = outer ? `${fmt(rl.overturns)} overturn times r_o/U, that is ${fmt(gap.overturns)} D/U` : `${fmt(gap.overturns)} overturn times D/U`;
    out.push(flagOf(RULES_D.minOverturns, "caution", ["runLength.overturns"],
      `${label}: the run lasts ${declared}, below the venue's minimum of ${fmt(p.minOverturns)} D/U.`,
      { expected: `≥ ${fmt(p.minOverturns)} D/U`, found: `${fmt(gap.overturns)} D/U${outer ? ` (${fmt(rl.overturns)} r_o/U)` : ""}`, run: label }));
  }
  out.push(...checkSeriesSpan(ctx));
  return out;
}

function checkSeriesSpan(ctx: RunContext): Flag[] {
  const t = ctx.run.time;
  const s = ctx.seriesColumns?.t;
  if (!s || s.length < 2 || t?.start === undefined || t.end === undefined) return [];
  const first = s[0] ?? 0;
  const last = s[s.length - 1] ?? 0;
  const dts = s.slice(1).map((v, i) => v - (s[i] ?? 0)).sort((a, b) => a - b);
  const dt = dts[Math.floor(dts.length / 2)] ?? 0;
  const slack = Math.max(ctx.policy.seriesSpanTolerance * (t.end - t.start), 1.5 * dt);
  if (Math.abs(first - t.start) <= slack && Math.abs(last - t.end) <= slack) return [];
  return [flagOf(RULES_D.seriesSpan, "mismatch", ["time.start", "time.end", "series.t"],
    `${ctx.label}: the series covers t = ${fmt(first)}…${fmt(last)} but the record declares time ${fmt(t.start)}…${fmt(t.end)} (same time unit expected).`,
    { expected: `${fmt(t.start)}…${fmt(t.end)}`, found: `${fmt(first)}…${fmt(last)}`, tolerance: `${fmt(slack)} time units at either end`, run: ctx.label })];
}
