/**
 * Family K's least-squares power law against outside references: a fit computed by hand,
 * and simple-statistics' linearRegression / rSquared on the logarithms (SE(b) from R² by
 * the textbook identity SE(b) = |b|·√((1 − R²)/(R²·(n − 2)))).
 */
import { linearRegression, rSquared } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { check } from "../../app/checker/index.ts";
import { fitPowerLaw } from "../../app/checker/power-law.ts";
import { baseRun, flagsOf, rng } from "./helpers.ts";

describe("least-squares power law", () => {
  it("matches a hand-computed fit: x = 1, 10, 100; y = 1, 3, 10", () => {
    // In log10: X = 0, 1, 2; Y = 0, log10 3, 1. Sxx = 2, Sxy = 1 → b = 0.5 exactly.
    // Residuals: r1 = (2·log10 3 − 1)/3, r0 = r2 = −r1/2; Σr² = 1.5·r1²; SE = √(Σr²/(n−2)/Sxx) = |r1|·√0.75.
    const fit = fitPowerLaw([1, 10, 100], [1, 3, 10])!;
    expect(fit.exponent).toBeCloseTo(0.5, 12);
    const r1 = (2 * Math.log10(3) - 1) / 3;
    expect(fit.standardError!).toBeCloseTo(Math.abs(r1) * Math.sqrt(0.75), 12);
    expect(fit.standardError!).toBeCloseTo(0.013209, 6);
    expect(fit.span).toBe(100);
  });

  it("agrees with simple-statistics on scattered data (slope and standard error)", () => {
    const r = rng(42);
    for (let trial = 0; trial < 20; trial++) {
      const n = 3 + Math.floor(r() * 12);
      const xs = Array.from({ length: n }, () => Math.exp(r() * 8));
      const ys = xs.map((x) => 0.85 * Math.pow(x, 0.41) * Math.exp(0.2 * (r() - 0.5)));
      const pts = xs.map((x, i) => [Math.log(x), Math.log(ys[i]!)] as [number, number]);
      const lr = linearRegression(pts);
      const line = (x: number) => lr.b + lr.m * x;
      const r2 = rSquared(pts, line);
      const se = Math.abs(lr.m) * Math.sqrt((1 - r2) / (r2 * (n - 2)));
      const fit = fitPowerLaw(xs, ys)!;
      expect(fit.exponent).toBeCloseTo(lr.m, 10);
      expect(Math.log(fit.prefactor)).toBeCloseTo(lr.b, 9);
      expect(fit.standardError! / se).toBeCloseTo(1, 8);
    }
  });

  it("is exact on an exact power law (SE 0) and refuses degenerate input", () => {
    const fit = fitPowerLaw([1, 2, 4, 8], [3, 3 * Math.SQRT2, 6, 6 * Math.SQRT2])!;
    expect(fit.exponent).toBeCloseTo(0.5, 14);
    expect(fit.standardError!).toBeLessThan(1e-12);
    expect(fitPowerLaw([2, 2, 2], [1, 2, 3])).toBeUndefined();
    expect(fitPowerLaw([1], [1])).toBeUndefined();
    expect(fitPowerLaw([1, 4], [1, 2])!.standardError).toBeUndefined();
  });
});

describe("scaling and ratio statements through the checker", () => {
  // Ro = 0.85·Ra*^0.41 (the 2006 scaling study's exponent), exact: the fitted b is 0.41.
  const runs = [1e-2, 1e-1, 1, 10].map((raStar, i) =>
    // RaBuoyancy = Ra·E²/Pr with E = 1e-3, Pr = 1 → Ra = Ra*·1e6
    baseRun({ label: `r${i}`, controls: { Ra: raStar * 1e6 }, diagnostics: { Ro: 0.85 * Math.pow(raStar, 0.41) } }));
  const claim = (value: string) => ({
    format: "runproof.claim/1", title: "Rossby scaling", runs: runs.map((r) => ({ label: r.label as string, part: "varied" })), varies: ["controls.Ra", "diagnostics"],
    stated: [{ quantity: "Ro", scalesWith: "RaBuoyancy", value }],
  });
  it("the contract's example: Ro ∝ RaBuoyancy^(0.41 ± 0.03) holds, 0.6 ± 0.03 does not", () => {
    expect(flagsOf(check({ runs, claim: claim("0.41 ± 0.03") }), "K.stated-exponent")).toEqual([]);
    const [f] = flagsOf(check({ runs, claim: claim("0.6 ± 0.03") }), "K.stated-exponent");
    expect(f!.expected as number).toBeCloseTo(0.41, 10);
    expect(f!.message).toContain("r0, r1, r2, r3");
  });
  it("runs spanning less than a factor 3 in x draw a caution, not a verdict", () => {
    const close = [1, 1.5, 2].map((raStar, i) => baseRun({ label: `c${i}`, controls: { Ra: raStar * 1e6 }, diagnostics: { Ro: 0.1 * raStar } }));
    const out = check({ runs: close, claim: { ...claim("0.41 ± 0.03"), runs: close.map((r) => ({ label: r.label as string, part: "varied" })) } });
    expect(flagsOf(out, "K.fit-undecided").map((f) => f.severity)).toEqual(["caution"]);
    expect(flagsOf(out, "K.stated-exponent")).toEqual([]);
  });
  it("a ratio across conventions is taken in the canonical frame (E_ro = E·(1−χ)², Λ unchanged by L)", () => {
    const a = baseRun({ diagnostics: { Re: 100 } });
    const b = baseRun({ label: "strat-B", conventions: { lengthScale: "outer-radius" }, controls: { E: 1e-3 * 0.65 ** 2, Ra: 1e5 / 0.65 ** 3 }, diagnostics: { Re: 130 / 0.65 } });
    const c = { format: "runproof.claim/1", title: "Re", runs: [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }], stated: [{ quantity: "Re", ratio: ["strat-B", "ref-A"], value: "1.3" }] };
    expect(flagsOf(check({ runs: [a, b], claim: c }), "K.stated-ratio")).toEqual([]);
  });
});
