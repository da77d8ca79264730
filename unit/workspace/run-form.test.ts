import { describe, expect, it } from "vitest";
import { runSchema } from "~/checker/schema";
import { demoRuns } from "~db/demo-data";
import { fieldForQuantity, formToRecord, recordToValues, RUN_FIELDS } from "~/workspace/run-form-fields";

describe("the run form mirrors runproof.run/1", () => {
  it("gives back the same record after a trip through the form's inputs", () => {
    for (const run of demoRuns) {
      const record = runSchema.parse(run);
      const values = new Map(Object.entries(recordToValues(record)));
      expect(runSchema.parse(formToRecord(values))).toEqual(record);
    }
  });

  it("names every input by a path the schema knows (so validation errors land on inputs)", () => {
    const shape = runSchema.shape as Record<string, unknown>;
    for (const f of RUN_FIELDS) expect(Object.keys(shape), f.path).toContain(f.path.split(".")[0]);
  });

  it("keeps a number that does not parse as text, so the schema names its field", () => {
    const out = runSchema.safeParse(formToRecord(new Map([["label", "x"], ["controls.E", "1e-4x"]])));
    expect(out.success).toBe(false);
    expect(out.error!.issues.some((i) => i.path.join(".") === "controls.E")).toBe(true);
  });

  it("reads Fortran-style D exponents typed into a number field", () => {
    expect((formToRecord(new Map([["controls.E", "1.0d-4"]])).controls as { E: number }).E).toBe(1e-4);
  });

  it("points a flag's quantity at its input", () => {
    expect(fieldForQuantity("Pm")).toBe("controls.Pm");
    expect(fieldForQuantity("eta")).toBe("material.eta");
    expect(fieldForQuantity("runLength.magnetic")).toBe("time.end");
    expect(fieldForQuantity("tangentCylinderLatitudeDeg")).toBeNull();
  });
});
