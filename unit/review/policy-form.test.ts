import { describe, expect, it } from "vitest";
import { DEFAULT_POLICY } from "~/checker/policy";
import { rules } from "~/checker/registry";
import { parsePolicyForm, POLICY_FIELD_INFO } from "~/review/policy-form";

describe("the venue's checker policy form", () => {
  it("names every numeric threshold in words with a unit, never by its key", () => {
    const numeric = Object.entries(DEFAULT_POLICY).filter(([, v]) => typeof v === "number").map(([k]) => k);
    expect(POLICY_FIELD_INFO.map((f) => f.key).sort()).toEqual(numeric.sort());
    for (const f of POLICY_FIELD_INFO) {
      expect(f.label, f.key).not.toContain(f.key);
      expect(f.label.split(" ").length, f.key).toBeGreaterThan(3);
      expect(f.unit.length, f.key).toBeGreaterThan(2);
    }
  });

  it("lists the rules each threshold governs, as the rules themselves declare", () => {
    const governs = (key: string) => POLICY_FIELD_INFO.find((f) => f.key === key)!.rules.map((r) => r.id);
    for (const r of rules.filter((x) => x.policyKey && x.policyKey !== "referenceBody")) expect(governs(r.policyKey!), r.id).toContain(r.id);
    expect(governs("minMagneticTimes").length).toBeGreaterThan(0);
    expect(governs("pileupMaxSlope").length).toBeGreaterThan(0);
  });

  it("names the threshold in its error and stores nothing of a rejected form", () => {
    const form = new FormData();
    form.set("minMagneticTimes", "-1");
    form.set("zScore", "abc");
    const out = parsePolicyForm(form, {});
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.fieldErrors.minMagneticTimes).toMatch(/^Shortest acceptable run, in magnetic diffusion times:/);
    expect(out.fieldErrors.zScore).toMatch(/is not a number/);
    const good = new FormData();
    good.set("minMagneticTimes", "1.5");
    expect(parsePolicyForm(good, {})).toEqual({ ok: true, policy: { minMagneticTimes: 1.5 } });
  });
});
