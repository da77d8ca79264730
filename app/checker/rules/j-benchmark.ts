/** Family J: a run that declares a benchmark case is compared with its reference solution. */
import { BENCHMARK_SOURCE, BENCHMARKS, type BenchmarkQuantity } from "../benchmarks.ts";
import type { RunContext } from "../context.ts";
import { CANONICAL, convert, type Scaled } from "../conventions.ts";
import { velocityToRe } from "../derive.ts";
import { flagOf, fmt, relDiff, type Flag, type RuleInfo } from "../types.ts";

export const RULES_J = {
  setup: {
    id: "J.benchmark-setup", family: "J", title: "Run does not have the benchmark's parameters",
    explanation: "A run declaring a benchmark case must use its control numbers, radius ratio and boundary conditions.",
    severities: ["mismatch"], source: BENCHMARK_SOURCE,
  },
  values: {
    id: "J.benchmark-values", family: "J", title: "Result differs from the benchmark's reference solution",
    explanation: "Kinetic and magnetic energy, drift frequency and point values must match the published reference within its tolerance or 1 %.",
    severities: ["mismatch"], policyKey: "benchmarkTolerance",
    threshold: "relative difference above the larger of the published uncertainty and policy.benchmarkTolerance (default 0.01)",
    source: BENCHMARK_SOURCE,
  },
  missing: {
    id: "J.benchmark-no-values", family: "J", title: "Benchmark declared but no values to compare",
    explanation: "A run declaring a benchmark should report at least its kinetic energy.",
    severities: ["note"], source: BENCHMARK_SOURCE,
  },
} satisfies Record<string, RuleInfo>;

/** (scaling for length/rotation, power of the velocity unit) for each benchmark quantity. */
const UNITS: Record<BenchmarkQuantity, [Scaled | undefined, number]> = {
  kineticEnergy: ["kineticEnergy", 2],
  magneticEnergy: ["magneticEnergy", 0],
  driftFrequency: ["driftFrequency", 1],
  pointTemperature: [undefined, 0],
  pointUphi: ["velocity", 1],
  pointBtheta: ["field", 0],
};

export function checkBenchmark(ctx: RunContext): Flag[] {
  const id = ctx.run.benchmark;
  if (!id) return [];
  const b = BENCHMARKS[id];
  const out: Flag[] = [];
  const run = ctx.run;
  const chi = run.geometry.radiusRatio;
  const own = run.conventions;
  const label = ctx.label;
  const setup = (q: string, expected: number | string | undefined, found: number | string | undefined) => {
    const same = typeof expected === "number" && typeof found === "number" ? relDiff(found, expected) <= 1e-6 : expected === found;
    if (!same) {
      out.push(flagOf(RULES_J.setup, "mismatch", [q],
        `${label}: ${b.id} (${b.title}) has ${q} = ${expected ?? "none"}, the run has ${found ?? "none"}.`,
        { ...(expected !== undefined ? { expected } : {}), ...(found !== undefined ? { found } : {}), run: label }));
    }
  };
  setup("chi", b.controls.chi, chi);
  setup("E", b.controls.E, ctx.derived.E !== undefined ? convert("E", ctx.derived.E, own, CANONICAL, chi) : undefined);
  setup("RaRotating", b.controls.RaRotating, ctx.derived.RaRotating !== undefined ? convert("RaRotating", ctx.derived.RaRotating, own, CANONICAL, chi) : undefined);
  setup("Pr", b.controls.Pr, ctx.derived.Pr);
  setup("Pm", b.controls.Pm, ctx.derived.Pm);
  for (const side of ["inner", "outer"] as const) {
    const bc = run.boundaries?.[side];
    if (bc?.velocity) setup(`boundaries.${side}.velocity`, "no-slip", bc.velocity);
    if (bc?.thermal) setup(`boundaries.${side}.thermal`, "fixed-value", bc.thermal);
    if (b.magnetic && bc?.magnetic) setup(`boundaries.${side}.magnetic`, b.magnetic, bc.magnetic);
  }
  if (run.boundaries?.inner?.rotation) setup("boundaries.inner.rotation", "fixed", run.boundaries.inner.rotation);

  const k = velocityToRe(run, ctx.derived);
  const reported = { ...run.diagnostics, ...pickSeries(ctx) } as Record<string, number | undefined>;
  let compared = 0;
  for (const [q, ref] of Object.entries(b.values) as Array<[BenchmarkQuantity, { value: number; uncertainty: number }]>) {
    const raw = run.diagnostics?.[q] ?? reported[q];
    if (raw === undefined) continue;
    const [scaled, vPow] = UNITS[q];
    if (vPow > 0 && k === undefined) continue;
    let v = scaled ? convert(scaled, raw, own, CANONICAL, chi) : raw;
    v *= Math.pow(k ?? 1, vPow);
    compared++;
    const tol = Math.max(ref.uncertainty, ctx.policy.benchmarkTolerance * Math.abs(ref.value));
    if (Math.abs(v - ref.value) > tol) {
      out.push(flagOf(RULES_J.values, "mismatch", [q],
        `${label}: ${q} = ${fmt(v)} in the benchmark's units, the reference for ${b.id} is ${ref.value} ± ${fmt(tol)}.`,
        { expected: ref.value, found: v, tolerance: tol, run: label }));
    }
  }
  if (compared === 0) {
    out.push(flagOf(RULES_J.missing, "note", ["kineticEnergy"], `${label}: declares ${b.id} but reports none of its reference quantities.`, { run: label }));
  }
  return out;
}

function pickSeries(ctx: RunContext): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [k, c] of Object.entries(ctx.series?.columns ?? {})) out[k] = c.mean;
  return out;
}
