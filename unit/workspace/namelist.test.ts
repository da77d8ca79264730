import { describe, expect, it } from "vitest";
import { namelistToRecord, parseKeyMap } from "~/workspace/namelist-map";
import { NamelistError, parseNamelist } from "~/workspace/namelist";

// Examples written per ISO/IEC 1539-1:2018 (Fortran 2018), 13.11.3 "Namelist formatting" and the
// list-directed value forms of 13.10.3: `&name`, name-value subsequences separated by commas or
// blanks, `/` ends the group, `r*c` repeats, apostrophe- or quote-delimited character values with
// doubled delimiters, logicals by their T/F letter, `!` comments, and names case-insensitive.
describe("parseNamelist (ISO/IEC 1539-1 NAMELIST input)", () => {
  it("reads the standard's basic form: group, name = value, slash", () => {
    const g = parseNamelist("&phys_param ek = 1.0d-4, ra = 2.0e7, pr = 1 /");
    expect(g).toEqual({ phys_param: { ek: 1e-4, ra: 2e7, pr: 1 } });
  });

  it("treats names case-insensitively and D exponents like E exponents", () => {
    const g = parseNamelist("&Control\n  EK = 3.5D+2\n  Tend = -1.25d0\n/");
    expect(g.control).toEqual({ ek: 350, tend: -1.25 });
  });

  it("reads an array as a list of values separated by commas or blanks", () => {
    const g = parseNamelist("&grid radii = 1, 2 3 ,4 /");
    expect(g.grid!.radii).toEqual([1, 2, 3, 4]);
  });

  it("expands repeat counts r*c", () => {
    const g = parseNamelist("&g a = 3*0.5, 2 /");
    expect(g.g!.a).toEqual([0.5, 0.5, 0.5, 2]);
  });

  it("reads logicals from their T or F letter with optional periods and trailing characters", () => {
    const g = parseNamelist("&f a = .true., b = .false., c = T, d = .Fals. /");
    expect(g.f).toEqual({ a: true, b: false, c: true, d: false });
  });

  it("reads strings in apostrophes or quotes, with a doubled delimiter as one character", () => {
    const g = parseNamelist(`&s tag = 'Veyra''s core', mode = "a, b / c" /`);
    expect(g.s).toEqual({ tag: "Veyra's core", mode: "a, b / c" });
  });

  it("skips comments that start with an exclamation mark", () => {
    const g = parseNamelist("&c ! physics\n ek = 1e-4 ! Ekman\n/");
    expect(g.c).toEqual({ ek: 1e-4 });
  });

  it("sets subscripted elements a(i) = … counting from 1", () => {
    const g = parseNamelist("&c a(2) = 7, 8 /");
    expect(g.c!.a).toEqual([undefined, 7, 8]);
  });

  it("reads several groups in one file", () => {
    const g = parseNamelist("&a x = 1 /\n&b y = 2 /");
    expect(Object.keys(g)).toEqual(["a", "b"]);
  });

  it("names the line of an error", () => {
    expect(() => parseNamelist("&a\n x = 1\n y = oops\n/")).toThrow(NamelistError);
    expect(() => parseNamelist("&a\n x = 1\n y = oops\n/")).toThrow(/line 3/);
    expect(() => parseNamelist("&a x = 1")).toThrow(/not closed/);
    expect(() => parseNamelist("&a s = 'open /")).toThrow(/never closed/);
  });
});

describe("namelistToRecord", () => {
  const map = parseKeyMap("ek = controls.E\nra = controls.Ra\n# comment\nvisc = material.nu [m^2/s]\ntag = ignore");

  it("maps keys to run-record paths, with units for dimensional fields", () => {
    expect(namelistToRecord("&p ek = 1d-4, ra = 2e7, visc = 0.5, tag = 'x' /", map)).toEqual({
      controls: { E: 1e-4, Ra: 2e7 },
      material: { nu: "0.5 m^2/s" },
    });
  });

  it("refuses a key the map does not cover, naming it", () => {
    try {
      namelistToRecord("&p ek = 1d-4, mystery = 3 /", map);
      expect.unreachable();
    } catch (e) {
      expect((e as { issues: { path: string }[] }).issues[0]!.path).toBe("&p mystery");
    }
  });
});
