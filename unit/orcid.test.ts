import { describe, expect, it } from "vitest";
import { orcidCheckDigit, parseOrcid } from "~/lib/orcid";

// Source: ORCID support, "Structure of the ORCID Identifier" — the worked examples
// 0000-0002-1825-0097, 0000-0001-5109-3700 and 0000-0002-1694-233X (check digit X), and the
// ISO 7064 MOD 11-2 algorithm given there.
const published = ["0000-0002-1825-0097", "0000-0001-5109-3700", "0000-0002-1694-233X"];

describe("ORCID iD check digit (ISO 7064 MOD 11-2)", () => {
  it.each(published)("accepts the published example %s", (id) => {
    expect(orcidCheckDigit(id.replaceAll("-", "").slice(0, 15))).toBe(id.at(-1));
    expect(parseOrcid(id)).toEqual({ ok: true, value: id });
  });

  it("accepts the https://orcid.org/ form and lower-case x", () => {
    expect(parseOrcid("https://orcid.org/0000-0002-1694-233x")).toEqual({ ok: true, value: "0000-0002-1694-233X" });
  });

  it.each(["0000-0002-1825-0098", "0000-0001-5109-3701", "0000-0002-1694-2330"])(
    "rejects %s with a wrong check digit and names the right one",
    (id) => {
      const result = parseOrcid(id);
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.message).toMatch(/should be [\dX], not/);
    },
  );

  it("rejects a malformed iD with the expected shape in the message", () => {
    const result = parseOrcid("0000-0002-1825");
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message).toContain("0000-0000-0000-0000");
  });
});
