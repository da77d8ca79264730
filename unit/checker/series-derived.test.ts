/**
 * derived.series against analytic results for an AR(1) process x_t = φ·x_{t−1} + ε_t with
 * unit-variance noise: variance 1/(1 − φ²), integrated autocorrelation time
 * τ_int = (1 + φ)/(1 − φ) (Sokal 1997, "Monte Carlo methods in statistical mechanics"),
 * so the standard error of the mean is √(τ_int/(n(1 − φ²))).
 */
import { describe, expect, it } from "vitest";
import { check } from "../../app/checker/index.ts";
import { ar1, baseRun, times } from "./helpers.ts";

describe("derived.series", () => {
  const n = 40_000;
  const phi = 0.5;
  const x = ar1(n, phi, 21).map((v) => 10 + v);
  const out = check({ runs: [baseRun()], series: { "ref-A": { t: times(n, 0, 20), Re: x, Rm: x.map((v) => 5 * v) } } });
  const s = out.runs[0]!.derived.series!;

  it("has one entry per column (not t) with the contract's keys", () => {
    expect(Object.keys(s)).toEqual(["Re", "Rm"]);
    expect(Object.keys(s.Re!).sort()).toEqual(["effectiveSamples", "mean", "stderr", "tauInt", "transientEnd", "z"]);
  });
  it("τ_int ≈ (1 + φ)/(1 − φ) = 3 samples; effective samples ≈ n/3", () => {
    expect(s.Re!.tauInt).toBeGreaterThan(2.7);
    expect(s.Re!.tauInt).toBeLessThan(3.3);
    expect(s.Re!.effectiveSamples / (n / 3)).toBeGreaterThan(0.9);
    expect(s.Re!.effectiveSamples / (n / 3)).toBeLessThan(1.12);
  });
  it("mean within 4 analytic standard errors of 10; the batch-means SE near the analytic one", () => {
    const analytic = Math.sqrt(3 / (n * (1 - phi * phi)));
    expect(Math.abs(s.Re!.mean - 10)).toBeLessThan(4 * analytic);
    expect(s.Re!.stderr / analytic).toBeGreaterThan(0.7);
    expect(s.Re!.stderr / analytic).toBeLessThan(1.3);
    expect(s.Rm!.mean / s.Re!.mean).toBeCloseTo(5, 10);
  });
  it("a stationary series has |z| small and its transient ends near the start", () => {
    expect(Math.abs(s.Re!.z!)).toBeLessThan(3);
    expect(s.Re!.transientEnd).toBeLessThan(10);
  });
  it("an initial exponential transient moves transientEnd later (MSER-5, White 1997)", () => {
    const m = 2000;
    const y = ar1(m, 0.3, 5).map((v, i) => 10 + 0.1 * v + 8 * Math.exp(-i / 60));
    const r = check({ runs: [baseRun()], series: { "ref-A": { t: times(m, 0, 20), Re: y } } });
    expect(r.runs[0]!.derived.series!.Re!.transientEnd).toBeGreaterThan(1); // 60 rows of decay ≈ 0.6 time units; several e-folds
  });
});
