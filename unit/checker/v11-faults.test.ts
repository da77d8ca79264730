/**
 * Faults of checker 1.0 that v1.1 fixes: partial controls, the physical run-length
 * minimum, stated averages against the attached series, messages that name runs by
 * label, and the streaming CSV reader's listeners.
 */
import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { check, CheckInputError } from "../../app/checker/index.ts";
import { parseCsvStream } from "../../app/checker/csv-stream.ts";
import { fmt } from "../../app/checker/types.ts";
import { ar1, baseRun, flagsOf, times } from "./helpers.ts";

describe("controls: every key optional, Ra from material", () => {
  // Definition of the classical Rayleigh number, Ra = α g ΔT D³/(ν κ), with D = r_o − r_i
  const ro = 3480e3;
  const D = ro * (1 - 0.35);
  const material = { nu: "1e-6 m^2/s", kappa: "1e-5 m^2/s", alpha: "1e-5 K^-1", gravity: "10 m/s^2", deltaT: "1e-3 K", outerRadius: "3480 km" };
  const byHand = (1e-5 * 10 * 1e-3 * D ** 3) / (1e-6 * 1e-5);

  it("a record without controls.Ra is accepted and Ra is recomputed from α, g, ΔT, D, ν, κ", () => {
    const out = check(baseRun({ controls: { Ra: undefined, E: 1e-3, Pr: 0.1 }, material }));
    const d = out.runs[0]!.derived;
    expect(d.Ra! / byHand - 1).toBeLessThan(1e-12);
    // rotating flavour Ra·E/Pr (2001 benchmark definition)
    expect(d.RaRotating! / ((byHand * 1e-3) / 0.1) - 1).toBeLessThan(1e-12);
  });
  it("a record with only E is accepted; Ra and Pr stay absent, never guessed", () => {
    const out = check(baseRun({ controls: { Ra: undefined, Pr: undefined, Pm: undefined }, diagnostics: { Re: 50 } }));
    const d = out.runs[0]!.derived;
    expect(d.E).toBe(1e-3);
    expect(d.Ra).toBeUndefined();
    expect(d.Pr).toBeUndefined();
    expect(d.RaRotating).toBeUndefined();
  });
  it("an empty controls object is refused with its path", () => {
    try {
      check(baseRun({ controls: { E: undefined, Ra: undefined, Pr: undefined, Pm: undefined } }));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CheckInputError);
      expect((e as CheckInputError).errors.map((x) => x.path)).toEqual(["runs[0].controls"]);
    }
  });
});

describe("run-length minimum is physical (gap units), the same under either length scale", () => {
  // 6 D²/ν at Pm = 5 is 6/5 = 1.2 D²/η; in outer-radius units, t_ro = t_D·(1−χ)² (L = D/(1−χ)),
  // so 6·0.65² = 2.535 r_o²/ν = 0.507 r_o²/η — the contract's example.
  const chi = 0.35;
  const asGap = (end: number) => baseRun({ time: { end } });
  const asOuter = (end: number) =>
    baseRun({ conventions: { lengthScale: "outer-radius" }, controls: { E: 1e-3 * (1 - chi) ** 2, Ra: 1e5 / (1 - chi) ** 3 }, time: { end: end * (1 - chi) ** 2 } });

  it("6 D²/ν (1.2 D²/η) draws no caution in either length scale", () => {
    expect(flagsOf(check(asGap(6)), "D.min-magnetic-times")).toEqual([]);
    const outer = check(asOuter(6));
    expect(outer.runs[0]!.derived.runLength!.magnetic).toBeCloseTo(0.507, 3);
    expect(flagsOf(outer, "D.min-magnetic-times")).toEqual([]);
  });
  it("4 D²/ν (0.8 D²/η) draws the caution in both, and the outer-radius flag names both units", () => {
    expect(flagsOf(check(asGap(4)), "D.min-magnetic-times")).toHaveLength(1);
    const [f] = flagsOf(check(asOuter(4)), "D.min-magnetic-times");
    expect(f!.severity).toBe("caution");
    expect(f!.message).toContain("0.338 magnetic diffusion times r_o²/η"); // 0.8·0.4225
    expect(f!.message).toContain("0.8 D²/η");
  });
  it("overturns compare in D/U: n_D = n_ro·r_o/D", () => {
    const hydro = (ls: "gap" | "outer-radius", end: number, Re: number) =>
      baseRun({ conventions: { lengthScale: ls }, controls: { Pm: undefined }, diagnostics: { Re }, time: { end } });
    // gap: 0.1 viscous times × Re 120 = 12 overturns ≥ 10
    expect(flagsOf(check(hydro("gap", 0.1, 120)), "D.min-overturns")).toEqual([]);
    // outer radius: same physics, t_ro = 0.1·0.4225, Re_ro = 120/0.65 → 8.03 r_o/U = 12 D/U
    expect(flagsOf(check(hydro("outer-radius", 0.1 * 0.4225, 120 / 0.65)), "D.min-overturns")).toEqual([]);
    expect(flagsOf(check(hydro("outer-radius", 0.05 * 0.4225, 120 / 0.65)), "D.min-overturns")).toHaveLength(1);
  });
});

describe("stated averages and diagnostics against the attached series (family E)", () => {
  // A stationary AR(1) series around 501.7 (φ = 0.3, σ = 5): its mean after the transient is the reference.
  const n = 600;
  const rm = ar1(n, 0.3, 5).map((x) => 501.7 + 5 * x);
  const mean = rm.reduce((a, b) => a + b, 0) / n;
  const input = (diag: number | undefined, value: string) => ({
    runs: [baseRun({ label: "strat-B", diagnostics: diag === undefined ? {} : { Rm: diag } })],
    series: { "strat-B": { t: times(n, 0, 20), Rm: rm } },
    claim: { format: "runproof.claim/1", title: "Rm", runs: [{ label: "strat-B", part: "varied" }], stated: [{ quantity: "Rm", value }] },
  });

  it("Rm ≈ 900 is compared with the series mean (≈ 501.7), not diagnostics.Rm = 300", () => {
    const out = check(input(300, "≈ 900"));
    const [f] = flagsOf(out, "E.stated-average");
    expect(f!.severity).toBe("mismatch");
    expect(Math.abs((f!.expected as number) - mean)).toBeLessThan(2); // MSER may trim a few rows
    expect(f!.message).toContain("strat-B");
    // ≈ 500 holds against the series even though diagnostics says 300
    expect(flagsOf(check(input(300, "≈ 500")), "E.stated-average")).toEqual([]);
  });
  it("diagnostics.Rm = 300 against a series mean of 501.7 is a mismatch; 505 is within 2 %", () => {
    const [f] = flagsOf(check(input(300, "≈ 500")), "E.diagnostic-vs-series");
    expect(f!.severity).toBe("mismatch");
    expect(String(f!.tolerance)).toContain("2 % relative");
    expect(flagsOf(check(input(505, "≈ 500")), "E.diagnostic-vs-series")).toEqual([]);
  });
});

describe("messages", () => {
  it("name runs by label, never by index, and say what the tolerance is", () => {
    const runs = ["a", "b", "strat-B"].map((label) => baseRun({ label, material: { nu: "1e-6 m^2/s", eta: "0.8e-6 m^2/s" } }));
    const flags = flagsOf(check({ runs }), "A.pm-from-diffusivities");
    expect(flags).toHaveLength(3);
    for (const f of flags) {
      expect(f.message).not.toMatch(/runs\[\d\]/);
      expect(f.tolerance).toBe("2 % relative");
      expect(f.message).toContain("tolerance 2 % relative");
    }
    expect(flags[2]!.message).toContain("strat-B");
  });
  it("print numbers to 4 significant figures in one format", () => {
    expect(fmt(1e-4)).toBe(fmt(0.0001));
    expect(fmt(1e-4)).toBe("1e-4");
    expect(fmt(123456)).toBe("1.235e5");
    expect(fmt(501.66)).toBe("501.7");
  });
});

describe("streaming CSV", () => {
  it("a large series in many small chunks emits no MaxListenersExceededWarning", async () => {
    const warnings: string[] = [];
    const onWarning = (w: Error) => warnings.push(w.name);
    process.on("warning", onWarning);
    const rows = 60_000;
    function* chunks() {
      yield "t,Re\n";
      for (let i = 0; i < rows; i += 50) yield Array.from({ length: 50 }, (_, k) => `${i + k},${(i + k) % 7}`).join("\n") + "\n";
    }
    const cols = await parseCsvStream(Readable.from(chunks(), { objectMode: false }), "series");
    await new Promise((r) => setTimeout(r, 20));
    process.off("warning", onWarning);
    expect(cols.t!.length).toBe(rows);
    expect(warnings).not.toContain("MaxListenersExceededWarning");
  });
});
