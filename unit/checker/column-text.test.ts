/**
 * Whitespace-separated column files. Number forms follow ISO/IEC 1539 (Fortran): the Dw.d
 * edit descriptor writes a D exponent (0.15D-02), Ew.d writes E, and an exponent of three
 * digits is written without the letter (0.15-100); list-directed input accepts both cases
 * of the letter and an optional exponent sign.
 */
import { describe, expect, it } from "vitest";
import { fortranNumber, parseColumnMap, parseColumnText } from "../../app/checker/column-text.ts";
import { parseSeriesCsv } from "../../app/checker/csv.ts";

describe("Fortran numbers (ISO/IEC 1539 Ew.d / Dw.d output forms)", () => {
  it.each([
    ["0.15D-02", 0.0015], ["1.5d-3", 0.0015], ["-.5D0", -0.5], ["2.5D+05", 250000], ["0.15E-02", 0.0015],
    ["0.15-100", 0.15e-100], ["0.15+100", 0.15e100], ["42", 42], ["-3.", -3], ["1.5e3", 1500],
  ])("%s = %d", (text, value) => {
    expect(fortranNumber(text)).toBe(value);
  });
  it.each(["NaN", "Infinity", "1.5Q-3", "abc", "1..2", "D-3", ""])("%s is not a number", (text) => {
    expect(Number.isNaN(fortranNumber(text))).toBe(true);
  });
});

describe("column files", () => {
  const text = [
    "# time      ekin          unused     rm",
    "! written by an invented code",
    "  0.0   1.0D+01   7   3.0D+02",
    "  0.5   1.1D+01   7   3.1D+02   ! trailing comment",
    "",
    "  1.0   1.2D+01   7   3.2D+02",
  ].join("\n");

  it("reads no-header columns by the map, skipping '-' columns and comments", () => {
    const cols = parseColumnText(text, parseColumnMap("t,kineticEnergy,-,Rm"), "series");
    expect(cols).toEqual({ t: [0, 0.5, 1], kineticEnergy: [10, 11, 12], Rm: [300, 310, 320] });
  });
  it("gives the same columns as the equivalent CSV", () => {
    const csv = "t,kineticEnergy,Rm\n0,10,300\n0.5,11,310\n1,12,320\n";
    expect(parseColumnText(text, parseColumnMap("t,kineticEnergy,-,Rm"), "series")).toEqual(parseSeriesCsv(csv));
  });
  it("errors name the line and say how to fix", () => {
    const map = parseColumnMap("t,Re");
    expect(() => parseColumnText("0 1\n1 2\n2 x\n", map, "series")).toThrow("line 3: column 2 (Re) is not a number ('x')");
    expect(() => parseColumnText("0 1 5\n1 2\n", map, "series")).toThrow("line 2: expected 3 columns like the first row, found 2");
    expect(() => parseColumnText("0\n1\n", map, "series")).toThrow(/line 1: the row has 1 columns but the column map names 2/);
    expect(() => parseColumnText("1 1\n0 2\n", map, "series")).toThrow(/line 2: column t must increase/);
    expect(() => parseColumnText("0 1\n1 2\n", parseColumnMap("time,Re"), "series")).toThrow(/column map: the first column of a series must be "t"/);
  });
  it("the map refuses odd names and too few columns", () => {
    expect(() => parseColumnMap("t")).toThrow(/2 to 200 columns/);
    expect(() => parseColumnMap("t,R m")).toThrow(/column 2 of the map is "R m"/);
    expect(parseColumnMap("l, kinetic ,-")).toEqual(["l", "kinetic", null]);
  });
});
