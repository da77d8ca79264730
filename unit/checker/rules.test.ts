import { describe, expect, it } from "vitest";
import { check, rules } from "../../app/checker/index.ts";
import { flagsOf } from "./helpers.ts";
import { CASES } from "./rule-cases.ts";

describe("every rule has a passing and a failing case", () => {
  for (const c of CASES) {
    it(`${c.rule}${c.severity ? ` (${c.severity})` : ""} — ${c.source}`, () => {
      const passFlags = flagsOf(check(c.pass), c.rule).filter((f) => !c.severity || f.severity === c.severity);
      expect(passFlags, JSON.stringify(passFlags)).toEqual([]);
      const failFlags = flagsOf(check(c.fail), c.rule);
      expect(failFlags.length).toBeGreaterThan(0);
      if (c.severity) expect(failFlags.map((f) => f.severity)).toContain(c.severity);
      for (const f of failFlags) {
        expect(f.message.length).toBeGreaterThan(10);
        expect(f.source).toBe(rules.find((r) => r.id === c.rule)?.source);
        expect(f.quantities.length).toBeGreaterThan(0);
      }
    });
  }

  it("the registry and the case table name the same rules", () => {
    const ids = new Set(rules.map((r) => r.id));
    const covered = new Set(CASES.map((c) => c.rule));
    expect([...ids].filter((id) => !covered.has(id))).toEqual([]);
    expect([...covered].filter((id) => !ids.has(id))).toEqual([]);
  });

  it("registry entries are complete and ids are unique", () => {
    const ids = rules.map((r) => r.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const r of rules) {
      expect(r.id.startsWith(`${r.family}.`)).toBe(true);
      expect(r.explanation.length).toBeGreaterThan(20);
      expect(r.severities.length).toBeGreaterThan(0);
      expect(r.source.length).toBeGreaterThan(5);
      if (r.policyKey) expect(r.defaultThreshold).toBeDefined();
    }
  });

  it("regime rules never raise more than a note (contract family I)", () => {
    for (const r of rules.filter((x) => x.family === "I")) expect(r.severities).toEqual(["note"]);
  });
});
