import { describe, expect, it } from "vitest";
import { check } from "../../app/checker/index.ts";
import { baseRun, merge } from "./helpers.ts";

// Contract, family G: compared runs may differ only in declared parameters (common practice).
// Material properties document the controls; only two stated, different values are a difference.
const claim = { format: "runproof.claim/1", title: "Layer on/off", runs: [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }], varies: ["stableLayer"], stated: [] };
const strat = (patch: object = {}) => merge(baseRun({ label: "strat-B", stableLayer: { position: "top", edgeRadius: 1.4 } }), patch);
const undeclared = (runs: unknown[]) => check({ runs, claim }).claimFlags.filter((f) => f.rule === "G.undeclared-difference");

describe("G.undeclared-difference and material properties", () => {
  it("does not count a material property stated by one run only", () => {
    expect(undeclared([baseRun(), strat({ material: { nu: "1e-6 m^2/s", eta: "5e-7 m^2/s" } })])).toEqual([]);
  });

  it("flags a material property both runs state with different values", () => {
    const flags = undeclared([
      baseRun({ material: { nu: "1e-6 m^2/s", eta: "5e-7 m^2/s" } }),
      strat({ material: { nu: "1e-6 m^2/s", eta: "2e-7 m^2/s" } }),
    ]);
    expect(flags.map((f) => f.quantities[0])).toEqual(["material.eta"]);
  });
});
