import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import {
  autocorrelation, batchMeansSE, effectiveSampleSize, integratedAutocorrelationTime, mean, mser, twoHalvesZ, variance,
} from "../../app/checker/stats.ts";
import { ar1, gaussian, rng } from "./helpers.ts";

describe("means and variances (reference: simple-statistics)", () => {
  const x = ar1(1000, 0.5, 21).map((v) => 3 + 2 * v);
  it("mean equals simple-statistics mean", () => {
    expect(mean(x)).toBeCloseTo(ss.mean(x), 12);
  });
  it("variance equals simple-statistics sampleVariance", () => {
    expect(variance(x)).toBeCloseTo(ss.sampleVariance(x), 10);
  });
});

describe("MSER-5 (White 1997, Simulation 69)", () => {
  it("finds a planted transient: a decay of 40 rows on top of noise is cut near its end", () => {
    const g = gaussian(rng(5));
    const x = Array.from({ length: 1000 }, (_, i) => 10 + 0.1 * g() + (i < 200 ? 5 * Math.exp(-i / 8) : 0));
    const { truncation } = mser(x, 5);
    // the decay falls below the noise level (0.1) after 8·ln(50) ≈ 31 rows
    expect(truncation).toBeGreaterThanOrEqual(15);
    expect(truncation).toBeLessThanOrEqual(80);
  });
  it("cuts nothing (or almost nothing) from a stationary series", () => {
    expect(mser(ar1(1000, 0.2, 9), 5).truncation).toBeLessThanOrEqual(25);
  });
  it("cuts a step-shaped warm-up at the step", () => {
    const x = Array.from({ length: 500 }, (_, i) => (i < 100 ? 20 : 10) + 0.01 * Math.sin(i));
    expect(mser(x, 5).truncation).toBe(100);
  });
});

describe("integrated autocorrelation time", () => {
  // analytic AR(1) result: ρ(t) = φ^t, τ_int = 1 + 2Σφ^t = (1+φ)/(1−φ)
  // (Sokal 1997, Monte Carlo Methods in Statistical Mechanics; Geyer 1992, Stat. Sci. 7)
  for (const phi of [0, 0.5, 0.8, 0.9]) {
    it(`AR(1) with φ = ${phi} gives τ ≈ (1+φ)/(1−φ) = ${((1 + phi) / (1 - phi)).toFixed(2)}`, () => {
      const taus = [1, 2, 3].map((seed) => integratedAutocorrelationTime(ar1(1 << 16, phi, seed)));
      const expected = (1 + phi) / (1 - phi);
      expect(Math.abs(mean(taus) - expected) / expected).toBeLessThan(0.1);
    });
  }
  it("autocorrelation of AR(1) at lag 1 is φ (analytic)", () => {
    expect(autocorrelation(ar1(1 << 16, 0.7, 4))[1]).toBeCloseTo(0.7, 1);
  });
  it("effective sample size of white noise is close to n", () => {
    const n = 4096;
    expect(effectiveSampleSize(ar1(n, 0, 8)) / n).toBeGreaterThan(0.8);
  });
});

describe("batch means standard error", () => {
  it("for white noise approaches σ/√n (standard result for the mean of iid samples)", () => {
    const ses = [1, 2, 3, 4, 5, 6].map((s) => batchMeansSE(ar1(10000, 0, s)));
    expect(mean(ses) / (1 / Math.sqrt(10000))).toBeGreaterThan(0.8);
    expect(mean(ses) / (1 / Math.sqrt(10000))).toBeLessThan(1.2);
  });
  it("for AR(1) approaches σ_x·√(τ/n) (asymptotic variance of the mean, Sokal 1997)", () => {
    const phi = 0.8;
    const sigmaX = 1 / Math.sqrt(1 - phi * phi);
    const tau = (1 + phi) / (1 - phi);
    const n = 40000;
    const ses = [1, 2, 3, 4, 5, 6].map((s) => batchMeansSE(ar1(n, phi, s)));
    const expected = sigmaX * Math.sqrt(tau / n);
    expect(mean(ses) / expected).toBeGreaterThan(0.75);
    expect(mean(ses) / expected).toBeLessThan(1.25);
  });
});

describe("two-halves z score (Geweke 1992 style)", () => {
  it("flags a trending series with |z| > 3", () => {
    const x = ar1(2000, 0.5, 12).map((v, i) => v + i / 400);
    expect(Math.abs(twoHalvesZ(x))).toBeGreaterThan(3);
  });
  it("stays below 3 for a stationary series", () => {
    expect(Math.abs(twoHalvesZ(ar1(2000, 0.5, 12)))).toBeLessThan(3);
  });
});
