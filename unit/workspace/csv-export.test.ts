import { parse } from "csv-parse/sync";
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { csvField, neutraliseFormula, toCsv } from "~/workspace/csv-export";

// RFC 4180 §2: CRLF line breaks (rule 2); fields with commas, quotes or line breaks enclosed in
// double quotes (rule 6); a quote inside a quoted field doubled (rule 7). csv-parse, an
// independent RFC 4180 parser, is the reference that reads back what we write.
describe("RFC 4180 CSV export", () => {
  it("quotes only the fields that need it and doubles inner quotes", () => {
    expect(csvField("ref-A")).toBe("ref-A");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvField(null)).toBe("");
    expect(csvField(2.5e-5)).toBe(String(2.5e-5));
    expect(csvField(Number.NaN)).toBe("");
  });

  it("ends every record with CRLF", () => {
    expect(toCsv(["a", "b"], [[1, 2]])).toBe("a,b\r\n1,2\r\n");
  });

  it("round-trips any text through an independent RFC 4180 parser", () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.string(), { minLength: 2, maxLength: 2 }), { maxLength: 8 }), (rows) => {
        const text = toCsv(["x", "y"], rows);
        const back = parse(text, { record_delimiter: "\r\n", relax_quotes: false }) as string[][];
        expect(back).toEqual([["x", "y"], ...rows.map((r) => r.map(neutraliseFormula))]);
      }),
    );
  });
});

// OWASP "CSV Injection": cells starting with =, +, -, @ (or tab / carriage return) are run as
// formulas by spreadsheet programs; prefixing an apostrophe makes them text.
describe("spreadsheet formula injection", () => {
  it("neutralises every formula trigger and leaves other text and numbers alone", () => {
    expect(csvField('=HYPERLINK("http://evil.example","click")')).toBe('"\'=HYPERLINK(""http://evil.example"",""click"")"');
    for (const trigger of ["=", "+", "-", "@", "\t", "\r"]) {
      const cell = csvField(`${trigger}1+1`);
      expect(cell.replace(/^"/, "").startsWith("'"), JSON.stringify(trigger)).toBe(true);
    }
    expect(csvField("ref-A")).toBe("ref-A");
    expect(csvField(-1.5)).toBe("-1.5");
  });

  it("no exported text cell starts with a trigger once read back by an RFC 4180 parser", () => {
    fc.assert(
      fc.property(fc.array(fc.string(), { minLength: 1, maxLength: 6 }), (cells) => {
        const back = (parse(toCsv(["x"], cells.map((c) => [c])), { record_delimiter: "\r\n" }) as string[][]).slice(1).flat();
        expect(back).toHaveLength(cells.length);
        for (const cell of back) expect(/^[=+\-@\t\r]/.test(cell), JSON.stringify(cell)).toBe(false);
      }),
      { numRuns: 500 },
    );
  });
});
