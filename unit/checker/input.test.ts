import { describe, expect, it } from "vitest";
import { check, CheckInputError, parseCheckInput, resolvePolicy, DEFAULT_POLICY } from "../../app/checker/index.ts";
import { baseRun, flagsOf } from "./helpers.ts";

const errorsOf = (input: unknown) => {
  const r = parseCheckInput(input);
  return r.ok ? [] : r.errors;
};

describe("input validation: what, where, how to fix", () => {
  it("accepts a single run record or a runs list", () => {
    expect(parseCheckInput(baseRun()).ok).toBe(true);
    expect(parseCheckInput({ runs: [baseRun()] }).ok).toBe(true);
  });
  it("rejects an unknown key with its path", () => {
    const e = errorsOf({ runs: [baseRun(), baseRun({ label: "b", controls: { Ekman: 1 } })] });
    expect(e[0]?.path).toBe("runs[1].controls.Ekman");
    expect(e[0]?.message).toMatch(/unknown key "Ekman".*remove it/);
  });
  it("names the allowed values of an enum and of the rotation factor", () => {
    const e = errorsOf(baseRun({ conventions: { lengthScale: "radius", rotationFactor: 3 } }));
    const paths = e.map((x) => x.path);
    expect(paths).toContain("runs[0].conventions.lengthScale");
    expect(e.find((x) => x.path === "runs[0].conventions.rotationFactor")?.message).toContain("one of 1, 2");
  });
  it("reports missing required fields", () => {
    const { controls: _c, ...rest } = baseRun();
    expect(errorsOf({ runs: [rest] }).map((x) => x.path)).toContain("runs[0].controls");
  });
  it("rejects duplicate labels, bad time spans and unmatched series", () => {
    const e = errorsOf({ runs: [baseRun(), baseRun({ time: { start: 5, end: 1 } })], series: { ghost: { t: [0, 1], Re: [1, 2] } } });
    expect(e.map((x) => x.path)).toEqual(expect.arrayContaining(["runs[1].label", "runs[1].time.end", "series.ghost"]));
  });
  it("checks series columns: t first, equal lengths", () => {
    const e = errorsOf({ runs: [baseRun()], series: { "ref-A": { Re: [1, 2], t: [0, 1] } } });
    expect(e[0]?.path).toBe('series["ref-A"]');
    const e2 = errorsOf({ runs: [baseRun()], series: { "ref-A": { t: [0, 1, 2], Re: [1, 2] } } });
    expect(e2[0]?.message).toContain("column Re has 2 values");
  });
  it("validates claims: quantity names, stated values, run labels, varies paths", () => {
    const claim = {
      format: "runproof.claim/1", title: "t", runs: [{ label: "ref-A", part: "reference" }], varies: ["stablelayer"],
      stated: [{ quantity: "Ekman", value: "1" }, { quantity: "E", value: "one" }, { quantity: "Pm", value: "2", run: "other" }],
    };
    const paths = errorsOf({ runs: [baseRun()], claim }).map((x) => x.path);
    expect([...paths].sort()).toEqual(["claim.stated[0].quantity", "claim.stated[1].value", "claim.stated[2].run", "claim.varies[0]"]);
  });
  it("validates ratio and scaling rows: runs of the claim, one kind per row, a readable ± value", () => {
    const claim = {
      format: "runproof.claim/1", title: "t", runs: [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }],
      stated: [
        { quantity: "Lambda", ratio: ["strat-B", "ghost"], value: "≈ 1.3" },
        { quantity: "Ro", scalesWith: "Rayleigh", value: "0.41 ± 0.03" },
        { quantity: "Ro", scalesWith: "RaBuoyancy", run: "ref-A", value: "0.41 ± 0.03" },
        { quantity: "Ro", scalesWith: "RaBuoyancy", value: "0.41 ± -0.03" },
      ],
    };
    const paths = errorsOf({ runs: [baseRun(), baseRun({ label: "strat-B" })], claim }).map((x) => x.path);
    expect([...paths].sort()).toEqual(["claim.stated[0].ratio[1]", "claim.stated[1].scalesWith", "claim.stated[2]", "claim.stated[3].value"]);
    const fixed = { ...claim, stated: claim.stated.slice(1, 2).map((r) => ({ ...r, scalesWith: "RaBuoyancy" })) };
    expect(errorsOf({ runs: [baseRun(), baseRun({ label: "strat-B" })], claim: { ...fixed, stated: [...fixed.stated, claim.stated[0]] } }).map((x) => x.path))
      .toEqual(["claim.stated[1].ratio[1]"]);
  });
  it("check throws CheckInputError whose message lists path and problem", () => {
    expect(() => check({ runs: [] })).toThrow(CheckInputError);
    expect(() => check(baseRun({ geometry: { radiusRatio: 1.2 } }))).toThrow(/runs\[0\]\.geometry\.radiusRatio/);
  });
});

describe("policy", () => {
  it("defaults follow the contract (1 magnetic time, 10 overturns, 2 % identities, 2 decades, 5 Ekman points, z 3, 1 % benchmark, factor 3)", () => {
    const p = resolvePolicy();
    expect([p.minMagneticTimes, p.minOverturns, p.identityTolerance, p.spectrumCautionDecades, p.spectrumMismatchDecades, p.ekmanLayerPoints, p.zScore, p.benchmarkTolerance, p.regimeFactor])
      .toEqual([1, 10, 0.02, 2, 1, 5, 3, 0.01, 3]);
    expect(p.referenceBody.outerRadiusKm).toBe(3480);
  });
  it("overrides change a rule's outcome, unknown keys are rejected", () => {
    const run = baseRun({ time: { end: 10 } }); // 2 magnetic times
    expect(flagsOf(check({ runs: [run] }), "D.min-magnetic-times")).toEqual([]);
    expect(flagsOf(check({ runs: [run], policy: { minMagneticTimes: 3 } }), "D.min-magnetic-times").length).toBe(1);
    expect(flagsOf(check({ runs: [run] }, { minMagneticTimes: 3 }), "D.min-magnetic-times").length).toBe(1);
    expect(errorsOf({ runs: [run], policy: { minMagneticTime: 3 } })[0]?.path).toBe("policy.minMagneticTime");
    expect(DEFAULT_POLICY.minMagneticTimes).toBe(1);
  });
});

describe("derived", () => {
  it("is absent when unknown, never guessed", () => {
    const d = check(baseRun({ controls: { Pm: undefined }, time: undefined })).runs[0]?.derived ?? {};
    for (const k of ["Pm", "Re", "Rm", "Lambda", "runLength", "averagingWindow", "layerThicknessKm", "NOverOmega", "q", "RaFlux"]) expect(d).not.toHaveProperty(k);
    expect(d.E).toBe(1e-3);
  });
  it("uses only the contract's keys", () => {
    const allowed = ["E", "Ra", "RaRotating", "RaBuoyancy", "RaFlux", "Pr", "Pm", "q", "chi", "Emag_ekman", "Re", "Rm", "Ro", "Rol", "Lo", "Lambda", "NOverOmega", "tangentCylinderLatitudeDeg", "layerThicknessKm", "layerTangentLatitudeDeg", "runLength", "averagingWindow"];
    const d = check(baseRun({ stableLayer: { position: "top", edgeRadius: 1.4, NOverOmega: 2 }, diagnostics: { Re: 7.8, Rol: 0.05, Nu: 2 } })).runs[0]?.derived ?? {};
    expect(Object.keys(d).filter((k) => !allowed.includes(k))).toEqual([]);
    expect(Object.keys(d).length).toBeGreaterThan(15);
  });
});
