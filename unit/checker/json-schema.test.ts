import { readdirSync, readFileSync } from "node:fs";
import Ajv2020 from "ajv/dist/2020.js";
import { describe, expect, it } from "vitest";
import { claimJsonSchema, runJsonSchema } from "../../app/checker/json-schema.ts";

const load = (dir: string) => readdirSync(dir).filter((f) => f.endsWith(".json")).map((f) => [f, JSON.parse(readFileSync(`${dir}/${f}`, "utf8"))] as const);

describe("published JSON Schemas (2020-12)", () => {
  const ajv = new Ajv2020({ strict: true, allErrors: true });
  const run = ajv.compile(runJsonSchema());
  const claim = ajv.compile(claimJsonSchema());

  it("carry $id, title and the 2020-12 dialect", () => {
    expect(runJsonSchema().$id).toBe("/schemas/run-1.json");
    expect(claimJsonSchema().$id).toBe("/schemas/claim-1.json");
    expect(runJsonSchema().$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    expect(runJsonSchema().title).toBe("runproof.run/1");
  });
  for (const [f, rec] of load("examples/runs")) {
    it(`accept the example run ${f}`, () => {
      expect(run(rec), JSON.stringify(run.errors)).toBe(true);
    });
  }
  for (const [f, rec] of load("examples/claims")) {
    it(`accept the example claim ${f}`, () => {
      expect(claim(rec), JSON.stringify(claim.errors)).toBe(true);
    });
  }
  it("reject an unknown key", () => {
    const [, rec] = load("examples/runs")[0] ?? [];
    expect(run({ ...rec, controls: { ...rec.controls, Ekman: 1e-3 } })).toBe(false);
    expect(run.errors?.[0]?.keyword).toBe("additionalProperties");
    expect(claim({ format: "runproof.claim/1", title: "x", runs: [{ label: "a", part: "reference" }], extra: 1 })).toBe(false);
  });
  it("reject a wrong enum value and a missing required key", () => {
    const [, rec] = load("examples/runs")[0] ?? [];
    expect(run({ ...rec, conventions: { ...rec.conventions, lengthScale: "radius" } })).toBe(false);
    const { controls: _c, ...rest } = rec;
    expect(run(rest)).toBe(false);
  });
});
