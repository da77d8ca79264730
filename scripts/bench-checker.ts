/**
 * Benchmark of the checker engine (not a test): times `check` on synthetic inputs.
 *   npm run --silent bench            (tsx scripts/bench-checker.ts)
 */
import { performance } from "node:perf_hooks";
import { check } from "../app/checker/index.ts";

function lcg(seed: number): () => number {
  let s = seed;
  return () => ((s = (s * 48271) % 2147483647) / 2147483647);
}

function series(n: number, seed: number): Record<string, number[]> {
  const r = lcg(seed);
  const t: number[] = [];
  const Re: number[] = [];
  const Rm: number[] = [];
  let x = 0;
  for (let i = 0; i < n; i++) {
    x = 0.9 * x + (r() - 0.5);
    t.push((20 * i) / (n - 1));
    Re.push(7.8 + 0.05 * x + 3 * Math.exp(-i / (n / 50)));
    Rm.push(5 * Re[i]!);
  }
  return { t, Re, Rm };
}

function run(label: string) {
  return {
    format: "runproof.run/1", label,
    geometry: { radiusRatio: 0.35 },
    conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
    controls: { E: 1e-3, Ra: 1e5, Pr: 1, Pm: 5 },
    material: { nu: "1e-6 m^2/s", eta: "2e-7 m^2/s" },
    resolution: { radialPoints: 49, radialGrid: "chebyshev", maxDegree: 48, maxOrder: 48 },
    time: { start: 0, end: 20 },
    diagnostics: { kineticEnergy: 30.8, Lambda: 6.26 },
  };
}

function time(name: string, f: () => unknown, reps: number): void {
  f(); // warm-up
  const t0 = performance.now();
  for (let i = 0; i < reps; i++) f();
  const ms = (performance.now() - t0) / reps;
  process.stdout.write(`${name.padEnd(44)} ${ms.toFixed(2).padStart(9)} ms\n`);
}

const l = Array.from({ length: 128 }, (_, i) => i + 1);
const spectrum = { l, kinetic: l.map((x) => 10 ** (-x / 30)), magnetic: l.map((x) => 10 ** (-x / 25)) };
time("1 run, no attachments", () => check({ runs: [run("a")] }), 200);
for (const rows of [1_000, 10_000, 100_000]) {
  time(`1 run, series of ${rows} rows × 2 columns`, () => check({ runs: [run("a")], series: { a: series(rows, 3) } }), rows >= 100_000 ? 3 : 20);
}
const many = Array.from({ length: 50 }, (_, i) => run(`r${i}`));
time("50 runs + claim over all + spectra", () => check({
  runs: many,
  spectra: Object.fromEntries(many.map((r) => [r.label, spectrum])),
  claim: { format: "runproof.claim/1", title: "b", runs: many.map((r, i) => ({ label: r.label, part: i === 0 ? "reference" : "varied" })), varies: ["controls.Ra"], stated: [{ quantity: "E", value: "1e-3" }] },
}), 20);
time("50 runs, scaling statement over all (family K)", () => check({
  runs: many.map((r, i) => ({ ...r, controls: { ...r.controls, Ra: 1e5 * (1 + i) }, diagnostics: { ...r.diagnostics, Re: 8 * Math.sqrt(1 + i) } })),
  claim: { format: "runproof.claim/1", title: "s", runs: many.map((r) => ({ label: r.label, part: "varied" })), varies: ["controls.Ra", "diagnostics"], stated: [{ quantity: "Re", scalesWith: "Ra", value: "0.5 ± 0.02" }] },
}), 20);
