import { evaluate } from "mathjs";
import { describe, expect, it } from "vitest";
import { check, CheckInputError, parseCheckInput } from "../../app/checker/index.ts";
import { DIMENSIONS, fieldScaleTesla, mu0, toSI, UnitError } from "../../app/checker/units.ts";
import { EARTH_CORE, EARTH_OMEGA } from "../../app/checker/reference.ts";
import { baseRun } from "./helpers.ts";

describe("units", () => {
  it("a wrong dimension gives a clear error with the field and the expected unit", () => {
    expect(() => toSI("3 km", DIMENSIONS.diffusivity, "runs[0].material.eta")).toThrow(
      '"3 km" for runs[0].material.eta is a length, expected a diffusivity (m^2/s)',
    );
  });
  it("the error reaches parseCheckInput with its JSON path", () => {
    const r = parseCheckInput({ runs: [baseRun({ material: { eta: "3 km" } })] });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]?.path).toBe("runs[0].material.eta");
      expect(r.errors[0]?.message).toContain("expected a diffusivity");
    }
  });
  it("a number without a unit is rejected", () => {
    expect(() => toSI("0.8", DIMENSIONS.diffusivity, "material.eta")).toThrow(/no unit/);
  });
  it("unknown units are rejected", () => {
    expect(() => toSI("0.8 furlongs^2/s", DIMENSIONS.diffusivity, "material.eta")).toThrow(UnitError);
  });
  it("converts prefixes, unicode and '1/K' forms", () => {
    expect(toSI("3480 km", DIMENSIONS.length, "x")).toBe(3.48e6);
    expect(toSI("1×10⁻⁶ m²/s", DIMENSIONS.diffusivity, "x")).toBeCloseTo(1e-6, 18);
    expect(toSI("1e-5 1/K", DIMENSIONS.expansivity, "x")).toBeCloseTo(1e-5, 18);
    expect(toSI("7.292115e-5 1/s", DIMENSIONS.angularVelocity, "x")).toBe(7.292115e-5);
  });
  it("rejects offset temperatures and cycles per second", () => {
    expect(() => toSI("2 degC", DIMENSIONS.temperature, "x")).toThrow(/temperature difference in K/);
    expect(() => toSI("1e-5 Hz", DIMENSIONS.angularVelocity, "x")).toThrow(/rad\/s/);
  });

  it("E recomputed from nu, omega and outerRadius agrees with a mathjs evaluation (WGS84 Ω, PREM r_o)", () => {
    // independent computation with mathjs units: E = ν/(Ω (r_o − r_i)²), r_i = χ r_o
    const expected = evaluate("(1e-6 m^2/s) / ((7.292115e-5 / s) * (3480 km * (1 - 0.35))^2)") as number;
    const run = baseRun({ material: { nu: "1e-6 m^2/s", omega: `${EARTH_OMEGA} rad/s`, outerRadius: `${EARTH_CORE.outerRadiusKm} km` } });
    const out = check(baseRun({ ...run, controls: { E: expected } }));
    expect(out.runs[0]?.flags.filter((f) => f.rule === "A.ekman-from-material")).toEqual([]);
    const wrong = check(baseRun({ ...run, controls: { E: expected * 1.05 } }));
    const flag = wrong.runs[0]?.flags.find((f) => f.rule === "A.ekman-from-material");
    expect(flag?.expected).toBeCloseTo(expected, 25);
    expect(typeof expected).toBe("number");
  });

  it("a configured E that matches the material only with rotation factor 2 gets a hint (E = ν/(2Ω D²))", () => {
    const E1 = evaluate("(1e-6 m^2/s) / ((7.292115e-5 / s) * (3480 km * 0.65)^2)") as number;
    const material = { nu: "1e-6 m^2/s", omega: "7.292115e-5 rad/s", outerRadius: "3480 km" };
    const f = check(baseRun({ controls: { E: E1 / 2 }, material })).runs[0]?.flags.find((x) => x.rule === "A.ekman-from-material");
    expect(f?.message).toContain("rotationFactor 2");
    const g = check(baseRun({ controls: { E: E1 * 0.65 ** 2 }, material })).runs[0]?.flags.find((x) => x.rule === "A.ekman-from-material");
    expect(g?.message).toContain('lengthScale "outer-radius"');
  });

  it("μ0 from mathjs is the CODATA 2018 value 1.25663706212e-6 N/A²", () => {
    // CODATA 2018 recommended value, μ0 = 1.25663706212(19)e-6 N A^-2
    expect(mu0()).toBeCloseTo(1.25663706212e-6, 16);
  });
  it("the benchmark's field unit √(ρμ0ηΩ) for Earth-like values is of order a millitesla (from memory: ~1–2 mT)", () => {
    const b = fieldScaleTesla(1.1e4, 1, EARTH_OMEGA);
    expect(b).toBeCloseTo(Math.sqrt(1.1e4 * 1.25663706212e-6 * 1 * 7.292115e-5), 12);
    expect(b).toBeGreaterThan(5e-4);
    expect(b).toBeLessThan(5e-3);
  });
  it("check throws CheckInputError listing every bad field", () => {
    try {
      check(baseRun({ material: { eta: "3 km", nu: "1 kg" } }));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CheckInputError);
      expect((e as CheckInputError).errors.map((x) => x.path).sort()).toEqual(["runs[0].material.eta", "runs[0].material.nu"]);
    }
  });
});
