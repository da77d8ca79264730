import { describe, expect, it } from "vitest";
import { pointsInLayer, gridNodes } from "../../app/checker/grid.ts";
import { check } from "../../app/checker/index.ts";
import { EARTH_CORE, EARTH_OMEGA } from "../../app/checker/reference.ts";
import { decadesOfDecay, tailSlope } from "../../app/checker/spectra.ts";
import { baseRun } from "./helpers.ts";

describe("reference values", () => {
  it("PREM radii: inner core 1221.5 km, CMB 3480 km (Dziewonski & Anderson 1981)", () => {
    expect(EARTH_CORE.innerRadiusKm).toBe(1221.5);
    expect(EARTH_CORE.outerRadiusKm).toBe(3480);
  });
  it("WGS84 angular velocity 7.292115e-5 rad/s", () => {
    expect(EARTH_OMEGA).toBe(7.292115e-5);
  });
});

describe("tangent cylinder and stable layer", () => {
  it("arccos(0.35) = 69.5° (contract, family H; trigonometry)", () => {
    expect(check(baseRun()).runs[0]?.derived.tangentCylinderLatitudeDeg).toBeCloseTo(69.51, 2);
  });
  it("Earth's tangent cylinder from PREM radii: arccos(1221.5/3480) ≈ 69.45°", () => {
    const d = check(baseRun({ geometry: { radiusRatio: 1221.5 / 3480 } })).runs[0]?.derived;
    expect(d?.tangentCylinderLatitudeDeg).toBeCloseTo((Math.acos(1221.5 / 3480) * 180) / Math.PI, 10);
    expect(d?.tangentCylinderLatitudeDeg).toBeCloseTo(69.45, 1);
  });
  it("a top layer edge at r = 3120 km of 3480 km is 360 km thick with latitude arccos(3120/3480) (PREM r_o)", () => {
    const chi = 0.35;
    const edgeGap = 3120 / 3480 / (1 - chi); // edge/r_o expressed in units of D
    const d = check(baseRun({ stableLayer: { position: "top", edgeRadius: edgeGap } })).runs[0]?.derived;
    expect(d?.layerThicknessKm).toBeCloseTo(360, 6);
    expect(d?.layerTangentLatitudeDeg).toBeCloseTo((Math.acos(3120 / 3480) * 180) / Math.PI, 8);
  });
  it("the same layer in outer-radius units gives the same numbers", () => {
    const d = check(baseRun({ conventions: { lengthScale: "outer-radius" }, controls: { E: 1e-3 * 0.65 ** 2 }, stableLayer: { position: "top", edgeRadius: 3120 / 3480 } })).runs[0]?.derived;
    expect(d?.layerThicknessKm).toBeCloseTo(360, 6);
  });
  it("a bottom layer counts from r_i; material.outerRadius overrides the reference body", () => {
    const d = check(baseRun({ conventions: { lengthScale: "outer-radius" }, controls: { E: 1e-3 * 0.65 ** 2 }, material: { outerRadius: "1800 km" }, stableLayer: { position: "bottom", edgeRadius: 0.45 } })).runs[0]?.derived;
    expect(d?.layerThicknessKm).toBeCloseTo((0.45 - 0.35) * 1800, 8);
  });
});

describe("Ekman-layer points on the declared grid", () => {
  it("Chebyshev–Gauss–Lobatto nodes are r_i + D(1 − cos(πk/(N−1)))/2", () => {
    const n = gridNodes("chebyshev", 5, 1, 2);
    const expected = [1, 1 + (1 - Math.SQRT1_2), 2, 3 - (1 - Math.SQRT1_2), 3];
    expect(n.length).toBe(5);
    n.forEach((x, i) => expect(x).toBeCloseTo(expected[i] ?? NaN, 12));
  });
  it("counts analytically: k ≤ (N−1)/π·arccos(1 − 2δ/D) nodes plus the boundary node", () => {
    for (const [N, E] of [[49, 1e-3], [97, 1e-4], [33, 1e-5]] as const) {
      const delta = Math.sqrt(E);
      const expected = Math.floor(((N - 1) / Math.PI) * Math.acos(1 - 2 * delta)) + 1;
      const c = pointsInLayer("chebyshev", N, 0.5, 1, delta);
      expect(c.inner).toBe(expected);
      expect(c.outer).toBe(expected);
    }
  });
  it("uniform grids have ⌊δ(N−1)/D⌋ + 1 points in the layer", () => {
    expect(pointsInLayer("uniform", 201, 0, 1, 0.0316).min).toBe(Math.floor(0.0316 * 200) + 1);
  });
});

describe("spectra", () => {
  it("decades from peak to truncation: 10·10^(−3) at the last degree is 3 decades", () => {
    expect(decadesOfDecay([1, 2, 3], [5, 10, 0.01]).decades).toBeCloseTo(3, 12);
  });
  it("tail slope of an exponential spectrum 10^(−l/10) is −0.1 decades per degree", () => {
    const l = Array.from({ length: 20 }, (_, i) => i + 1);
    expect(tailSlope(l, l.map((x) => 10 ** (-x / 10)), 5)).toBeCloseTo(-0.1, 10);
  });
});
