import { describe, expect, it } from "vitest";
import { contains, describe as describeIv, parseStated, StatedValueError } from "../../app/checker/stated.ts";

// Reading of stated values by significant figures: half a unit in the last stated
// digit (common practice, as fixed by the product contract, family B).
const CASES: Array<[string, number, number, boolean, boolean]> = [
  // text, lo, hi, loInclusive, hiInclusive
  ["3e-5", 2.5e-5, 3.5e-5, true, false],
  ["3.0e-5", 2.95e-5, 3.05e-5, true, false],
  ["3E-5", 2.5e-5, 3.5e-5, true, false],
  ["3 × 10^-5", 2.5e-5, 3.5e-5, true, false],
  ["3×10⁻⁵", 2.5e-5, 3.5e-5, true, false],
  ["3·10^-5", 2.5e-5, 3.5e-5, true, false],
  ["3 x 10^(-5)", 2.5e-5, 3.5e-5, true, false],
  ["\u22123e-5", -3.5e-5, -2.5e-5, true, false],
  ["10^-4", 0.5e-4, 1.5e-4, true, false],
  ["2", 1.5, 2.5, true, false],
  ["360", 359.5, 360.5, true, false],
  ["1.25", 1.245, 1.255, true, false],
  ["≈ 360", 324, 396, true, true],
  ["about 360", 324, 396, true, true],
  ["≈ 3.14159", 3.14159 * 0.9, 3.14159 * 1.1, true, true],
  ["~1e4", 1e4 / Math.sqrt(10), 1e4 * Math.sqrt(10), true, true],
  ["order of 1e4", 1e4 / Math.sqrt(10), 1e4 * Math.sqrt(10), true, true],
  ["< 5", -Infinity, 5, false, false],
  ["<= 5", -Infinity, 5, false, true],
  ["≤ 5", -Infinity, 5, false, true],
  ["> 1.5", 1.5, Infinity, false, false],
  ["≥ 1.5", 1.5, Infinity, true, false],
  [">= 1.5", 1.5, Infinity, true, false],
  ["1–2", 1, 2, true, true],
  ["1-2", 1, 2, true, true],
  ["1 to 2", 1, 2, true, true],
  ["1e-5-2e-5", 1e-5, 2e-5, true, true],
  ["1 × 10^-5 – 3 × 10^-5", 1e-5, 3e-5, true, true],
];

describe("stated values", () => {
  for (const [text, lo, hi, li, hiI] of CASES) {
    it(`reads ${JSON.stringify(text)}`, () => {
      const iv = parseStated(text);
      if (Number.isFinite(lo)) expect(Math.abs(iv.lo - lo)).toBeLessThanOrEqual(1e-12 * Math.abs(lo));
      else expect(iv.lo).toBe(lo);
      if (Number.isFinite(hi)) expect(Math.abs(iv.hi - hi)).toBeLessThanOrEqual(1e-12 * Math.abs(hi));
      else expect(iv.hi).toBe(hi);
      expect(iv.loInclusive).toBe(li);
      expect(iv.hiInclusive).toBe(hiI);
    });
  }

  it("honours precision at the edges: 3e-5 contains 2.5e-5 but not 3.5e-5", () => {
    const iv = parseStated("3e-5");
    expect(contains(iv, 2.5e-5)).toBe(true);
    expect(contains(iv, 3.4999e-5)).toBe(true);
    expect(contains(iv, 3.5e-5)).toBe(false);
    expect(contains(parseStated("3.0e-5"), 3.1e-5)).toBe(false);
  });

  it("accepts numbers and describes intervals for messages", () => {
    expect(parseStated(2).lo).toBe(1.5);
    expect(describeIv(parseStated("3.0e-5"))).toBe('"3.0e-5" = [2.95e-5, 3.05e-5)');
    expect(describeIv(parseStated("≥ 1.5"))).toContain("≥ 1.5");
  });

  for (const bad of ["abc", "", "3 km", "≈", "2–1", "1e-5e3"]) {
    it(`rejects ${JSON.stringify(bad)} with a hint`, () => {
      expect(() => parseStated(bad)).toThrow(StatedValueError);
    });
  }
});
