import { describe, expect, it } from "vitest";
import { z } from "zod";
import "~/lib/zod-messages";
import { fieldLabel } from "~/lib/zod-messages";

const first = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  if (r.success) throw new Error("expected a failure");
  return r.error.issues[0]!.message;
};

describe("validation messages people read", () => {
  it("names the quantity and says what is wrong", () => {
    expect(first(z.object({ controls: z.object({ E: z.number().positive() }) }), { controls: { E: -1e-4 } })).toBe("Ekman number must be positive.");
    expect(first(z.object({ Pm: z.number().min(0.01) }), { Pm: 0 })).toBe("Magnetic Prandtl number must be at least 0.01.");
    expect(first(z.object({ radialPoints: z.number().int().max(4096) }), { radialPoints: 9000 })).toBe("Number of radial points must be at most 4096.");
  });

  it("says a missing field is required, and a wrong type in words", () => {
    expect(first(z.object({ title: z.string().min(1) }), { title: "" })).toBe("Title is required.");
    expect(first(z.object({ title: z.string() }), {})).toBe("Title is required.");
    expect(first(z.object({ nu: z.number() }), { nu: "fast" })).toBe("Kinematic viscosity ν must be a number.");
    expect(first(z.object({ email: z.email() }), { email: "nobody" })).toBe("E-mail address must be an e-mail address such as name@example.org.");
  });

  it("keeps a message the schema spells out itself", () => {
    expect(first(z.object({ E: z.number().positive("E must be above zero: the Ekman number of a rotating run") }), { E: 0 })).toBe("E must be above zero: the Ekman number of a rotating run");
  });

  it("turns unknown keys into words", () => {
    expect(fieldLabel(["runs", 2, "layerThicknessKm"])).toBe("Layer thickness km");
    expect(fieldLabel([])).toBe("This value");
  });
});
