/** JSON Schema (2020-12) documents generated from the zod schemas. */
import * as z from "zod";
import { claimSchema, runSchema } from "./schema.ts";

function generate(schema: z.ZodType, id: string, title: string, description: string): Record<string, unknown> {
  const js = z.toJSONSchema(schema, { target: "draft-2020-12" }) as Record<string, unknown>;
  const { $schema, ...rest } = js;
  return { $schema, $id: id, title, description, ...rest };
}

export function runJsonSchema(): Record<string, unknown> {
  return generate(
    runSchema,
    "/schemas/run-1.json",
    "runproof.run/1",
    "One simulation run: geometry, conventions, control numbers, optional material properties, boundaries, stable layer, resolution, time span, diagnostics and benchmark case.",
  );
}

export function claimJsonSchema(): Record<string, unknown> {
  return generate(
    claimSchema,
    "/schemas/claim-1.json",
    "runproof.claim/1",
    "A figure or statement of a manuscript: the runs it rests on, the run-record paths it varies and the values it states.",
  );
}
