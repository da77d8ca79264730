import { describe, expect, it } from "vitest";
import { CREDIT_ROLES } from "~/workspace/credit";
import { normalizeDoi, parseDoiList } from "~/workspace/doi";

// DOI syntax: ISO 26324 and the DOI Handbook §2.2 — prefix "10." + registrant code, "/", suffix.
describe("DOI syntax", () => {
  it("accepts bare DOIs, resolver links and doi: prefixes, returning the bare DOI", () => {
    expect(normalizeDoi("10.1000/182")).toBe("10.1000/182"); // the DOI Handbook's own DOI
    expect(normalizeDoi("https://doi.org/10.5281/zenodo.1234567")).toBe("10.5281/zenodo.1234567");
    expect(normalizeDoi("doi:10.1016/S0031-9201(01)00275-8")).toBe("10.1016/S0031-9201(01)00275-8");
    expect(normalizeDoi("10.1000.10/abc")).toBe("10.1000.10/abc"); // subdivided registrant code
  });

  it("refuses what is not a DOI", () => {
    for (const bad of ["11.1000/182", "10.12/abc", "10.1000", "10.1000/", "zenodo.1234567"]) expect(normalizeDoi(bad), bad).toBeNull();
  });

  it("splits a list and reports each bad entry", () => {
    expect(parseDoiList("10.1000/182, nope 10.5281/zenodo.1")).toEqual({ dois: ["10.1000/182", "10.5281/zenodo.1"], bad: ["nope"] });
  });
});

// ANSI/NISO Z39.104-2022, CRediT (Contributor Roles Taxonomy): 14 roles.
describe("CRediT roles", () => {
  it("lists the 14 roles of ANSI/NISO Z39.104-2022", () => {
    expect(CREDIT_ROLES).toHaveLength(14);
    expect(new Set(CREDIT_ROLES).size).toBe(14);
    for (const r of ["Conceptualization", "Data curation", "Formal analysis", "Writing – review & editing"]) expect(CREDIT_ROLES).toContain(r);
  });
});
