/**
 * The claim page's stated-against-recomputed rows agree with the checker's flags: a row that
 * "differs" is exactly a mismatch flag of the stated-value rules, on every passing and failing
 * case of the rule table, and the interval is the one the contract gives for "3.0e-5".
 */
import { describe, expect, it } from "vitest";
import { check, parseCheckInput, resolvePolicy, statedComparisons } from "../../app/checker/index.ts";
import { buildRunContext } from "../../app/checker/context.ts";
import { intervalText } from "../../app/components/workspace/stated-table.tsx";
import { baseRun } from "./helpers.ts";
import { CASES } from "./rule-cases.ts";

const STATED_MISMATCH = new Set(["B.stated-value", "B.stated-vs-material", "D.stated-run-length", "H.stated-geometry", "E.stated-average", "K.stated-ratio", "K.stated-exponent"]);

function comparisonsOf(input: unknown) {
  const parsed = parseCheckInput(input);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
  const v = parsed.value;
  const policy = resolvePolicy(v.policy);
  const runs = new Map(v.runs.map((r, i) => [r.label, buildRunContext(r, i, policy, v.series?.[r.label], v.spectra?.[r.label])]));
  return statedComparisons({ claim: v.claim!, runs, policy });
}

const withClaims = CASES.flatMap((c) => [["pass", c.pass], ["fail", c.fail]] as const).filter(([, input]) => (input as { claim?: { stated?: unknown[] } }).claim?.stated?.length);

describe("stated values beside the recomputed ones", () => {
  it("has claims with stated values to compare in the rule table", () => {
    expect(withClaims.length).toBeGreaterThan(10);
  });

  it.each(withClaims.map(([kind, input], i) => [i, kind, input] as const))("case %i (%s): 'differs' rows are the stated-value mismatch flags", (_i, _kind, input) => {
    const flags = check(input).claimFlags;
    const rows = comparisonsOf(input);
    const mismatches = flags.filter((f) => STATED_MISMATCH.has(f.rule) && f.severity === "mismatch").map((f) => f.claimRow).sort();
    const differs = rows.filter((r) => r.outcome === "differs").map((r) => r.row).sort();
    expect(differs).toEqual(mismatches);
    const undecided = rows.filter((r) => r.outcome === "undecided").map((r) => r.row).sort();
    expect(undecided).toEqual(flags.filter((f) => f.rule === "K.fit-undecided").map((f) => f.claimRow).sort());
  });

  it("reads 3.0e-5 as [2.95e-5, 3.05e-5) and 3e-5 as [2.5e-5, 3.5e-5) (checker contract, family B)", () => {
    const claim = (value: string) => ({
      runs: [baseRun({ controls: { E: 3e-5 } })],
      claim: { format: "runproof.claim/1", title: "t", runs: [{ label: "ref-A", part: "reference" }], varies: [], stated: [{ quantity: "E", value }] },
    });
    const [narrow] = comparisonsOf(claim("3.0e-5"));
    expect(narrow!.interval.lo).toBeCloseTo(2.95e-5, 12);
    expect(narrow!.interval.hi).toBeCloseTo(3.05e-5, 12);
    expect(intervalText(narrow!.interval)).toBe("[2.95 × 10⁻⁵, 3.05 × 10⁻⁵)");
    expect(narrow!.against).toEqual({ source: "record", value: 3e-5 });
    expect(narrow!.outcome).toBe("agrees");
    const [wide] = comparisonsOf(claim("3e-5"));
    expect(intervalText(wide!.interval)).toBe("[2.5 × 10⁻⁵, 3.5 × 10⁻⁵)");
    const [off] = comparisonsOf(claim("3.2e-5"));
    expect(off!.outcome).toBe("differs");
    const [atLeast] = comparisonsOf(claim("≥ 1e-5"));
    expect(atLeast!.interval.hi).toBeNull();
    expect(intervalText(atLeast!.interval)).toBe("≥ 10⁻⁵");
  });
});
