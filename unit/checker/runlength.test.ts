import { describe, expect, it } from "vitest";
import { check } from "../../app/checker/index.ts";
import { baseRun } from "./helpers.ts";

/**
 * Run-length conversions checked against physical durations. A run of physical length
 * T with ν, κ, η, Ω and length unit L lasts T·ν/L² viscous times, T·η/L² magnetic times,
 * T·κ/L² thermal times, T·Ω/(2π) rotations and T·U/L overturns (definitions of the
 * time units; U = Re·ν/L). Convention used by the checker: every unit uses the run's
 * declared length L (D for "gap", r_o for "outer-radius"); rotations count physical turns.
 */
const nu = 1e-6, kappa = 1e-5, eta = 2e-7, omega = 7.292115e-5; // Ω: WGS84
const ro = 3480e3; // PREM core–mantle boundary radius
const chi = 0.35;
const T = 3.0e13; // seconds
const U = 2e-4; // m/s

for (const lengthScale of ["gap", "outer-radius"] as const) {
  for (const rotationFactor of [1, 2] as const) {
    const L = lengthScale === "gap" ? ro * (1 - chi) : ro;
    const E = nu / (rotationFactor * omega * L * L);
    const Pr = nu / kappa;
    const Pm = nu / eta;
    const Re = (U * L) / nu;
    const expected = {
      viscous: (T * nu) / (L * L),
      magnetic: (T * eta) / (L * L),
      thermal: (T * kappa) / (L * L),
      rotations: (T * omega) / (2 * Math.PI),
      overturns: (T * U) / L,
    };
    const inUnit = {
      viscous: expected.viscous,
      magnetic: expected.magnetic,
      thermal: expected.thermal,
      rotation: T * rotationFactor * omega,
    };
    describe(`run length, ${lengthScale}, rotation factor ${rotationFactor}`, () => {
      for (const [timeScale, duration] of Object.entries(inUnit)) {
        it(`from ${timeScale} units to every other unit`, () => {
          const run = baseRun({
            geometry: { radiusRatio: chi },
            conventions: { lengthScale, timeScale, rotationFactor },
            controls: { E, Pr, Pm },
            time: { start: 1, end: 1 + duration },
            diagnostics: { Re },
          });
          const rl = check(run).runs[0]?.derived.runLength;
          expect(rl).toBeDefined();
          for (const [k, v] of Object.entries(expected)) {
            const got = rl?.[k as keyof typeof expected];
            expect(got, k).toBeDefined();
            expect(Math.abs((got ?? NaN) - v) / v, `${timeScale} → ${k}`).toBeLessThan(1e-9);
          }
        });
      }
      it("t_visc = E·t_rot, t_mag = t_visc/Pm, t_therm = t_visc/Pr (contract identities)", () => {
        expect(expected.viscous).toBeCloseTo(E * inUnit.rotation, 6);
        expect(expected.magnetic).toBeCloseTo(expected.viscous / Pm, 9);
        expect(expected.thermal).toBeCloseTo(expected.viscous / Pr, 9);
      });
    });
  }
}

describe("run length edge cases", () => {
  it("is absent when Pm is unknown for magnetic units, never guessed", () => {
    const rl = check(baseRun({ controls: { Pm: undefined }, conventions: { timeScale: "viscous" } })).runs[0]?.derived.runLength;
    expect(rl?.magnetic).toBeUndefined();
    expect(rl?.viscous).toBe(20);
  });
  it("cannot convert from magnetic units without Pm", () => {
    const d = check(baseRun({ controls: { Pm: undefined }, conventions: { timeScale: "magnetic" } })).runs[0]?.derived;
    expect(d?.runLength).toBeUndefined();
  });
});
