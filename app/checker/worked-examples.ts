/**
 * Worked examples for the checks help page: small invented inputs run through the real
 * checker, so the page shows what the checker actually says. A test keeps each example
 * raising the flag it explains.
 */
import { check } from "./index.ts";

const run = (label: string, patch: Record<string, unknown>) => ({
  format: "runproof.run/1",
  label,
  geometry: { radiusRatio: 0.35 },
  conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
  controls: { E: 1e-4, Ra: 2e7, Pr: 1, Pm: 2 },
  time: { start: 0, end: 2 },
  ...patch,
});

export interface WorkedExample {
  id: string;
  family: "E" | "K";
  rule: string;
  title: string;
  /** what the author wrote, as JSON fragments */
  given: string[];
  /** the computation, step by step, in words */
  steps: string[];
  input: unknown;
}

const RA_STAR = [0.01, 0.1, 1, 10];
const SCATTER = [1.05, 0.95, 1.04, 0.97];
const scalingRuns = RA_STAR.map((raStar, i) =>
  // Ra* = Ra·E²/Pr with E = 1e-4, Pr = 1, so Ra = Ra*·1e8
  run(`ra-${i + 1}`, { controls: { E: 1e-4, Ra: raStar * 1e8, Pr: 1, Pm: 2 }, diagnostics: { Ro: 0.85 * Math.pow(raStar, 0.41) * (SCATTER[i] ?? 1) } }));

const n = 200;
const t = Array.from({ length: n }, (_, i) => (2 * i) / (n - 1));
const rm = t.map((_, i) => 501.7 + 4 * Math.sin(1.3 * i) + 3 * Math.cos(0.37 * i));

export const WORKED_EXAMPLES: WorkedExample[] = [
  {
    id: "example-ratio",
    family: "K",
    rule: "K.stated-ratio",
    title: "A ratio between two runs",
    given: [
      `ref-A: "diagnostics": { "Lambda": 2.0 }`,
      `strat-B: "diagnostics": { "Lambda": 2.6 }`,
      `claim: { "quantity": "Lambda", "ratio": ["strat-B", "ref-A"], "value": "≈ 1.5" }`,
    ],
    steps: [
      "The ratio is Λ(strat-B)/Λ(ref-A) = 2.6/2.0 = 1.3.",
      "\"≈ 1.5\" is read as at least ±10 %: [1.35, 1.65] (family B's precision rules).",
      "1.3 lies outside, so the statement is a mismatch; \"≈ 1.3\" would pass.",
    ],
    input: {
      runs: [run("ref-A", { diagnostics: { Lambda: 2 } }), run("strat-B", { diagnostics: { Lambda: 2.6 } })],
      claim: {
        format: "runproof.claim/1", title: "Field strength with the layer", varies: ["diagnostics"],
        runs: [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }],
        stated: [{ quantity: "Lambda", ratio: ["strat-B", "ref-A"], value: "≈ 1.5" }],
      },
    },
  },
  {
    id: "example-scaling",
    family: "K",
    rule: "K.stated-exponent",
    title: "A scaling exponent over four runs",
    given: [
      "four runs with Ra* = 0.01, 0.1, 1, 10 and Ro = 0.85·Ra*^0.41 times 1.05, 0.95, 1.04, 0.97",
      `claim: { "quantity": "Ro", "scalesWith": "RaBuoyancy", "value": "0.6 ± 0.03" }`,
    ],
    steps: [
      "The checker fits log Ro = a + b·log Ra* by ordinary least squares over the claim's runs (Ra* spans a factor 1000, more than the 3 needed).",
      "The standard error of b comes from the residuals: SE(b) = √(Σr²/(n−2) / Σ(log x − mean)²).",
      "The stated interval [0.57, 0.63] does not overlap b ± 2·SE(b), so the statement is a mismatch; \"0.41 ± 0.03\" would pass.",
    ],
    input: {
      runs: scalingRuns,
      claim: {
        format: "runproof.claim/1", title: "Rossby number scaling", varies: ["controls.Ra", "diagnostics"],
        runs: scalingRuns.map((r) => ({ label: r.label, part: "varied" })),
        stated: [{ quantity: "Ro", scalesWith: "RaBuoyancy", value: "0.6 ± 0.03" }],
      },
    },
  },
  {
    id: "example-diagnostic-series",
    family: "E",
    rule: "E.diagnostic-vs-series",
    title: "A diagnostic that disagrees with its own series",
    given: [`strat-B: "diagnostics": { "Rm": 300 }`, "an attached series of Rm that averages about 501.7 over t = 0…2"],
    steps: [
      "MSER-5 finds the end of the initial transient; the mean of the rest is about 501.7 with a batch-means standard error.",
      "The allowed difference is the larger of 2 % of the mean (about 10) and 3 standard errors.",
      "300 differs from 501.7 by about 200, far more: a mismatch. A claim stating \"Rm ≈ 500\" is checked against the series mean, not against 300.",
    ],
    input: { runs: [run("strat-B", { diagnostics: { Rm: 300 } })], series: { "strat-B": { t, Rm: rm } } },
  },
];

/** Each example with the checker's own flags for its rule (messages as reviewers read them). */
export function workedExampleResults() {
  return WORKED_EXAMPLES.map((e) => {
    const out = check(e.input);
    const flags = [...out.runs.flatMap((r) => r.flags), ...out.claimFlags].filter((f) => f.rule === e.rule);
    return { id: e.id, family: e.family, rule: e.rule, title: e.title, given: e.given, steps: e.steps, flags: flags.map((f) => ({ severity: f.severity, message: f.message })) };
  });
}
