/** Family D: run length in every time unit, against the venue's minimum and the series. */
import type { RunContext } from "../context.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const CP = "common practice";

export const RULES_D = {
  minMagnetic: {
    id: "D.min-magnetic-times", family: "D", title: "Dynamo run shorter than the minimum in magnetic diffusion times",
    explanation: "A dynamo run should last at least the venue's minimum number of magnetic diffusion times L²/η.",
    severities: ["caution"], policyKey: "minMagneticTimes", threshold: "runLength.magnetic below policy.minMagneticTimes (default 1)", source: CP,
  },
  minOverturns: {
    id: "D.min-overturns", family: "D", title: "Non-magnetic run shorter than the minimum in overturns",
    explanation: "A non-magnetic run should last at least the venue's minimum number of overturn times L/U.",
    severities: ["caution"], policyKey: "minOverturns", threshold: "runLength.overturns below policy.minOverturns (default 10)", source: CP,
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
    threshold: "ends differ by more than policy.seriesSpanTolerance (default 0.02) of the run length, or 1.5 sampling intervals", source: CP,
  },
  stated: {
    id: "D.stated-run-length", family: "D", title: "Stated run length differs from the recomputed one",
    explanation: "A claim's stated run length must agree, within its stated precision, with the length recomputed from time and the control numbers.",
    severities: ["mismatch"], source: "common practice (significant-figure reading of stated values)",
  },
} satisfies Record<string, RuleInfo>;

export function checkRunLength(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const rl = ctx.derived.runLength;
  const p = ctx.policy;
  const label = ctx.label;
  if (ctx.magnetic) {
    if (rl?.magnetic === undefined) {
      out.push(flagOf(RULES_D.unknown, "note", ["runLength.magnetic", "time"], `${label}: the run length in magnetic diffusion times is unknown; give time.start and time.end.`, { run: label }));
    } else if (rl.magnetic < p.minMagneticTimes) {
      out.push(flagOf(RULES_D.minMagnetic, "caution", ["runLength.magnetic"],
        `${label}: the run lasts ${fmt(rl.magnetic)} magnetic diffusion times, below the minimum of ${fmt(p.minMagneticTimes)}.`,
        { expected: `≥ ${p.minMagneticTimes}`, found: rl.magnetic, run: label }));
    }
  } else if (rl?.overturns === undefined) {
    out.push(flagOf(RULES_D.unknown, "note", ["runLength.overturns", "time", "Re"],
      `${label}: the run length in overturn times is unknown; give time.start, time.end and Re (or kineticEnergy or a series).`, { run: label }));
  } else if (rl.overturns < p.minOverturns) {
    out.push(flagOf(RULES_D.minOverturns, "caution", ["runLength.overturns"],
      `${label}: the run lasts ${fmt(rl.overturns)} overturn times, below the minimum of ${fmt(p.minOverturns)}.`,
      { expected: `≥ ${p.minOverturns}`, found: rl.overturns, run: label }));
  }
  out.push(...checkSeriesSpan(ctx));
  return out;
}

function checkSeriesSpan(ctx: RunContext): Flag[] {
  const t = ctx.run.time;
  // The series' span and median step come from its stored analysis (computed once on arrival).
  const s = ctx.series;
  if (!s || s.rows < 2 || t?.start === undefined || t.end === undefined) return [];
  const first = s.tStart;
  const last = s.tEnd;
  const dt = s.dt;
  const slack = Math.max(ctx.policy.seriesSpanTolerance * (t.end - t.start), 1.5 * dt);
  if (Math.abs(first - t.start) <= slack && Math.abs(last - t.end) <= slack) return [];
  return [flagOf(RULES_D.seriesSpan, "mismatch", ["time.start", "time.end", "series.t"],
    `${ctx.label}: the series covers t = ${fmt(first)}…${fmt(last)} but the record declares time ${fmt(t.start)}…${fmt(t.end)} (same time unit expected).`,
    { expected: `${t.start}…${t.end}`, found: `${first}…${last}`, tolerance: slack, run: ctx.label })];
}
