import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { BENCHMARKS } from "../../app/checker/benchmarks.ts";
import { check } from "../../app/checker/index.ts";
import { baseRun, flagsOf } from "./helpers.ts";

// Christensen et al. 2001, Phys. Earth Planet. Inter. 128, 25–34: case 1 has E = 1e-3,
// Ra = 100 (= Ra_classical·E/Pr), Pr = 1, Pm = 5, χ = 0.35; published E_kin = 30.773,
// E_mag = 626.41 (per unit volume, B in √(ρμ0ηΩ)).
describe("2001 dynamo benchmark, case 1", () => {
  const run = baseRun({ diagnostics: { kineticEnergy: 30.773, magneticEnergy: 626.41 } });
  const d = check(run).runs[0]?.derived;

  it("Ra = 1e5 classical gives Ra·E/Pr = 100", () => {
    expect(d?.RaRotating).toBeCloseTo(100, 10);
  });
  it("Re = √(2·E_kin) ≈ 7.845 from the published kinetic energy", () => {
    expect(d?.Re).toBeCloseTo(7.845, 3);
  });
  it("Λ = 2·E·Pm·E_mag ≈ 6.264 from the published magnetic energy", () => {
    expect(d?.Lambda).toBeCloseTo(6.264, 3);
  });
  it("Rm = Re·Pm ≈ 39.2 and Ro = Re·E ≈ 7.8e-3 follow by the identities", () => {
    expect(d?.Rm).toBeCloseTo(5 * Math.sqrt(2 * 30.773), 10);
    expect(d?.Ro).toBeCloseTo(1e-3 * Math.sqrt(2 * 30.773), 12);
    expect(d?.Emag_ekman).toBeCloseTo(2e-4, 15);
  });
  it("the same run in outer-radius units with rotation factor 2 derives the same benchmark numbers after conversion", () => {
    const s = 0.65;
    const ro = baseRun({
      conventions: { lengthScale: "outer-radius", rotationFactor: 2, rayleigh: "rotating" },
      controls: { E: (1e-3 * s * s) / 2, Ra: 100 / s / 2 },
      benchmark: "dynamo-2001-case-1",
      diagnostics: { kineticEnergy: 30.773 / (s * s) },
    });
    expect(flagsOf(check(ro), "J.benchmark-setup")).toEqual([]);
    expect(flagsOf(check(ro), "J.benchmark-values")).toEqual([]);
  });
  it("the example record of case 1 passes every benchmark check", () => {
    const rec = JSON.parse(readFileSync("examples/runs/bench-case1.json", "utf8"));
    const out = check(rec);
    expect(out.runs[0]?.flags.filter((f) => f.rule.startsWith("J.") || f.severity === "mismatch")).toEqual([]);
  });
  it("a drift frequency 2 % off the published −3.1017 is a mismatch", () => {
    const bad = baseRun({ benchmark: "dynamo-2001-case-1", diagnostics: { kineticEnergy: 30.773, driftFrequency: -3.1017 * 1.02 } });
    const f = flagsOf(check(bad), "J.benchmark-values");
    expect(f.map((x) => x.quantities[0])).toEqual(["driftFrequency"]);
  });
});

describe("2001 dynamo benchmark, case 0 (published E_kin = 58.348, ω = 0.1824, T = 0.42812, u_φ = −10.1571)", () => {
  it("reference values are those of the paper's table", () => {
    const v = BENCHMARKS["dynamo-2001-case-0"].values;
    expect([v.kineticEnergy?.value, v.driftFrequency?.value, v.pointTemperature?.value, v.pointUphi?.value]).toEqual([58.348, 0.1824, 0.42812, -10.1571]);
    const w = BENCHMARKS["dynamo-2001-case-1"].values;
    expect([w.kineticEnergy?.value, w.magneticEnergy?.value, w.driftFrequency?.value, w.pointTemperature?.value, w.pointUphi?.value, w.pointBtheta?.value])
      .toEqual([30.773, 626.41, -3.1017, 0.37338, -7.625, -4.9289]);
  });
  it("the example record of case 0 passes; a point temperature 2 % off fails", () => {
    const rec = JSON.parse(readFileSync("examples/runs/bench-case0.json", "utf8"));
    expect(flagsOf(check(rec), "J.benchmark-values")).toEqual([]);
    expect(flagsOf(check(rec), "J.benchmark-setup")).toEqual([]);
    rec.diagnostics.pointTemperature = 0.42812 * 1.02;
    expect(flagsOf(check(rec), "J.benchmark-values").length).toBe(1);
  });
  it("case 0 is non-magnetic: declaring Pm is a setup mismatch", () => {
    const rec = JSON.parse(readFileSync("examples/runs/bench-case0.json", "utf8"));
    rec.controls.Pm = 5;
    expect(flagsOf(check(rec), "J.benchmark-setup").map((f) => f.quantities[0])).toContain("Pm");
  });
});
