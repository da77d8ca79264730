/** The help page's worked examples raise exactly the flag they explain, with the numbers they quote. */
import { describe, expect, it } from "vitest";
import { WORKED_EXAMPLES, workedExampleResults } from "../../app/checker/worked-examples.ts";
import { fitPowerLaw } from "../../app/checker/power-law.ts";

describe("worked examples of the checks help page", () => {
  const results = workedExampleResults();
  it("cover family K and the new family-E rule, each with one mismatch", () => {
    expect(results.map((r) => r.rule)).toEqual(["K.stated-ratio", "K.stated-exponent", "E.diagnostic-vs-series"]);
    for (const r of results) expect(r.flags.map((f) => f.severity)).toEqual(["mismatch"]);
  });
  it("quote numbers the checker agrees with", () => {
    expect(results[0]!.flags[0]!.message).toContain("= 1.3");
    // the exponent of the scaling example, fitted independently here: 0.41 plus the scatter's effect
    const input = WORKED_EXAMPLES[1]!.input as { runs: { diagnostics: { Ro: number } }[] };
    const fit = fitPowerLaw([0.01, 0.1, 1, 10], input.runs.map((r) => r.diagnostics.Ro))!;
    expect(Math.abs(fit.exponent - 0.41)).toBeLessThan(0.03);
    expect(results[1]!.flags[0]!.message).toContain(`b = ${Number(fit.exponent.toPrecision(4))}`);
    expect(results[2]!.flags[0]!.message).toMatch(/averages 501\.\d/);
  });
});
