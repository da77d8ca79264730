import { describe, expect, it } from "vitest";
import { diffFlags, diffParameters, groupByRuleAndRun, type FlagLite } from "~/review/diff";

const f = (rule: string, run: string | null, q = "Pm"): FlagLite => ({ fingerprint: `${rule}|${run ?? ""}||${q}`, rule, runLabel: run, severity: "mismatch", message: `${rule} on ${run}` });

describe("round diffs", () => {
  it("pairs flags by fingerprint into new, resolved and persisting", () => {
    const before = [f("A.pm", "strat-B"), f("D.length", "strat-B", "runLength"), f("G.diff", null, "eta")];
    const after = [f("D.length", "strat-B", "runLength"), f("F.res", "ref-A", "maxDegree")];
    const d = diffFlags(before, after);
    expect(d.added.map((x) => x.rule)).toEqual(["F.res"]);
    expect(d.resolved.map((x) => x.rule).sort()).toEqual(["A.pm", "G.diff"]);
    expect(d.persisting.map((x) => x.rule)).toEqual(["D.length"]);
    expect(groupByRuleAndRun(d.resolved)).toEqual([
      { rule: "A.pm", runs: [{ run: "strat-B", flags: [before[0]] }] },
      { rule: "G.diff", runs: [{ run: "(claim)", flags: [before[2]] }] },
    ]);
  });

  it("lists every changed, added and removed parameter by dotted path", () => {
    const a = { controls: { E: 1e-4, Pm: 2 }, material: { eta: "0.8e-6 m^2/s" }, stableLayer: { NOverOmega: 2 } };
    const b = { controls: { E: 1e-4, Pm: 2 }, material: { eta: "0.5e-6 m^2/s", nu: "1e-6 m^2/s" } };
    expect(diffParameters(a, b)).toEqual([
      { path: "material.eta", before: "0.8e-6 m^2/s", after: "0.5e-6 m^2/s" },
      { path: "material.nu", before: undefined, after: "1e-6 m^2/s" },
      { path: "stableLayer.NOverOmega", before: 2, after: undefined },
    ]);
    expect(diffParameters(a, structuredClone(a))).toEqual([]);
  });
});
