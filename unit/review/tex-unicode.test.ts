import { describe, expect, it } from "vitest";
import { texToUnicode } from "~/review/tiptap/tex-unicode";

// Expected characters are the Unicode code points for the TeX commands as listed in Unicode
// Technical Report #25 "Unicode support for mathematics" (from memory) and the Unicode Greek block.
describe("TeX to readable Unicode", () => {
  it("maps Greek letters to their code points", () => {
    expect(texToUnicode("\\nu/\\eta")).toBe("\u03bd/\u03b7");
    expect(texToUnicode("N/\\Omega")).toBe("N/\u03a9");
    expect(texToUnicode("\\Lambda")).toBe("\u039b");
  });

  it("keeps spacing commands as spaces and drops TeX's own spaces", () => {
    expect(texToUnicode("Ro = Re\\,E")).toBe("Ro = Re\u2009E");
    expect(texToUnicode("a\\quad b")).toBe("a\u2003b");
    expect(texToUnicode("a\\!b")).toBe("ab");
  });

  it("writes superscripts and subscripts as Unicode script characters where they exist", () => {
    expect(texToUnicode("E = \\nu/(\\Omega L^2)")).toBe("E = ν/(ΩL²)");
    expect(texToUnicode("10^{-4}")).toBe("10\u207b\u2074");
    expect(texToUnicode("u_{0}")).toBe("u\u2080");
    expect(texToUnicode("Ra_{c}")).toBe("Ra_c");
    expect(texToUnicode("B_{\\theta}^{2}")).toBe("B_θ²");
  });

  it("reads fractions, roots, font commands and operators", () => {
    expect(texToUnicode("\\mathrm{Pm} = \\frac{\\nu}{\\eta}")).toBe("Pm = ν/η");
    expect(texToUnicode("\\frac{a+b}{2}")).toBe("(a+b)/2");
    expect(texToUnicode("\\sqrt{Ra}")).toBe("√(Ra)");
    expect(texToUnicode("E \\leq 10^{-3} \\times Ro \\approx 1")).toBe("E ≤ 10⁻³ × Ro ≈ 1");
    expect(texToUnicode("\\left( x \\right)")).toBe("(x)");
    expect(texToUnicode("1\\times 10^{3}")).toBe("1 × 10³");
  });

  it("never lets TeX source through", () => {
    for (const tex of ["\\unknowncommand{x}", "\\\\", "\\href{javascript:alert(1)}{x}", "{{{", "}}}", "\\", "x^", "\\frac{1}"]) {
      const out = texToUnicode(tex);
      expect(out, tex).not.toMatch(/[\\{}$]/);
    }
  });

  it("bounds the work on very long input", () => {
    const out = texToUnicode("\\alpha".repeat(100_000));
    expect([...out].length).toBeLessThanOrEqual(2000);
  });
});

describe("TeX relations", () => {
  it("spaces =, < and > however they were typed", () => {
    expect(texToUnicode("\\nu/\\eta=1.25")).toBe("ν/η = 1.25");
    expect(texToUnicode("Ro<1")).toBe("Ro < 1");
    expect(texToUnicode("Ro = Re\\,E")).toBe("Ro = Re\u2009E");
  });
});
