/**
 * The zod schemas of the public API: request bodies and queries the routes parse with, and the
 * response shapes. `app/api/openapi.ts` builds the OpenAPI document from these same objects, so
 * the document cannot drift from what the routes accept.
 */
import * as z from "zod";
import { checkInputSchema, claimSchema, runSchema } from "~/checker/schema";

const when = () => z.iso.datetime({ offset: true }).describe("ISO 8601 time");
const id = (what: string) => z.uuid().describe(what);

export const errorSchema = z
  .object({
    error: z.object({
      code: z.string().meta({ example: "invalid_input" }),
      message: z.string().describe("what went wrong and how to fix it"),
      details: z.array(z.object({ path: z.string().describe("JSON path of the problem, e.g. controls.E"), message: z.string() })),
    }),
  })
  .meta({ id: "Error" });

export const runRecordSchema = runSchema.meta({ id: "RunRecord", description: "A run record in the runproof.run/1 format (see /schemas/run-1.json)." });
export const claimRecordSchema = claimSchema.meta({ id: "ClaimRecord", description: "A claim in the runproof.claim/1 format (see /schemas/claim-1.json)." });
export const checkRequestSchema = checkInputSchema.meta({ id: "CheckInput" });

// --- path parameters
export const submissionParams = z.object({ submissionId: id("submission id") });
export const roundParams = submissionParams.extend({ round: z.string().regex(/^[1-9][0-9]*$/).describe("round number, 1, 2, …") });
export const runParams = roundParams.extend({ runId: id("run id") });
export const claimParams = roundParams.extend({ claimId: id("claim id") });

// --- submissions and rounds
export const submissionSummarySchema = z
  .object({
    id: z.uuid(),
    title: z.string(),
    stage: z.string(),
    venue: z.object({ id: z.uuid(), name: z.string(), blinding: z.enum(["single", "double"]) }),
    roles: z.array(z.enum(["author", "co-author", "editor", "reviewer", "invited", "admin"])).describe("what you are to its rounds"),
    updatedAt: when(),
  })
  .meta({ id: "SubmissionSummary" });

export const roundSummarySchema = z
  .object({ number: z.number().int(), state: z.string(), sentAt: when().nullable(), checkedAt: when().nullable() })
  .meta({ id: "RoundSummary" });

export const submissionSchema = submissionSummarySchema
  .extend({
    abstract: z.string(),
    keywords: z.array(z.string()),
    contributors: z
      .array(z.object({ position: z.number().int(), name: z.string(), affiliation: z.string() }))
      .nullable()
      .describe("null for a reviewer of a double-blind venue"),
    rounds: z.array(roundSummarySchema).describe("the rounds you may read"),
  })
  .meta({ id: "Submission" });

export const flagCountsSchema = z.object({ mismatch: z.number().int(), caution: z.number().int(), note: z.number().int() });

export const roundSchema = roundSummarySchema
  .extend({
    submissionId: z.uuid(),
    version: z.number().int(),
    runCount: z.number().int(),
    claimCount: z.number().int(),
    flagCounts: flagCountsSchema,
    checking: z.boolean().describe("a change to the round is still being checked: its flags describe the round before that change"),
    checkError: z.string().nullable().describe("why the last check failed; while set, the round's flags are out of date and it cannot be sent"),
  })
  .meta({ id: "Round" });

// --- flags
export const flagSchema = z
  .object({
    id: z.uuid(),
    rule: z.string().meta({ example: "A2" }),
    severity: z.enum(["mismatch", "caution", "note"]),
    run: z.string().nullable().describe("run label"),
    claimId: z.uuid().nullable(),
    quantities: z.array(z.string()),
    message: z.string(),
    detail: z.record(z.string(), z.unknown()).describe("expected, found, tolerance, source"),
    authorAnswer: z.string().nullable(),
  })
  .meta({ id: "Flag" });

export const flagsQuerySchema = z
  .object({
    severity: z.enum(["mismatch", "caution", "note"]).optional(),
    rule: z.string().min(1).optional().describe("rule id, e.g. A2"),
    run: z.string().min(1).optional().describe("run label"),
    claim: z.uuid().optional().describe("claim id"),
  })
  .strict();

export const flagListSchema = z.object({ items: z.array(flagSchema), advisory: z.string() }).meta({ id: "FlagList" });

// --- runs
/** The columns of the app's runs table: a few controls and derived values recomputed by the checker. */
export const RUN_COLUMNS = ["E", "Ra", "RaRotating", "Pr", "Pm", "Rm", "runLengthMagnetic"] as const;
export const RUN_SORTS = ["label", "version", "updatedAt", "flags", "mismatch", "caution", "note", ...RUN_COLUMNS] as const;
export const runsQuerySchema = z
  .object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(25),
    sort: z.enum(RUN_SORTS).default("label"),
    dir: z.enum(["asc", "desc"]).default("asc"),
  })
  .strict();

export const runSummarySchema = z
  .object({
    id: z.uuid(),
    label: z.string(),
    version: z.number().int(),
    origin: z.string(),
    updatedAt: when(),
    flagCounts: flagCountsSchema,
    columns: z
      .object(Object.fromEntries(RUN_COLUMNS.map((k) => [k, z.number().nullable()])) as Record<(typeof RUN_COLUMNS)[number], z.ZodNullable<z.ZodNumber>>)
      .describe("E, Ra, Ra (rotating), Pr, Pm, Rm and the run length in magnetic diffusion times, as recomputed; null when unknown"),
  })
  .meta({ id: "RunSummary" });

export const runListSchema = z
  .object({
    items: z.array(runSummarySchema),
    page: z.number().int(),
    pageSize: z.number().int(),
    total: z.number().int(),
    sort: z.enum(RUN_SORTS),
    dir: z.enum(["asc", "desc"]),
  })
  .meta({ id: "RunList" });

export const attachmentSchema = z
  .object({
    id: z.uuid(),
    kind: z.enum(["series", "spectrum"]),
    filename: z.string(),
    columns: z.array(z.string()),
    rowCount: z.number().int(),
    createdAt: when(),
  })
  .meta({ id: "Attachment" });

export const runSchemaOut = runSummarySchema
  .omit({ columns: true })
  .extend({
    record: runRecordSchema,
    derived: z.record(z.string(), z.unknown()).describe("values the checker recomputed (the `derived` object of checker.md)"),
    flags: z.array(flagSchema),
    attachments: z.array(attachmentSchema),
    advisory: z.string(),
  })
  .meta({ id: "Run" });

export const runUpdateSchema = z
  .object({ expectedVersion: z.number().int().min(1).max(1_000_000).describe("the version you edited; 409 when the run has moved on"), record: runRecordSchema })
  .strict()
  .meta({ id: "RunUpdate", description: "Either this object, or a bare run record with the version in an If-Match header." });

/** PUT body of a run: the wrapper, or a bare record (told apart by `format`, for precise error paths). */
export const runPutBodySchema = z.union([runUpdateSchema, runRecordSchema]);
export const runPutSchemaFor = (body: unknown) =>
  typeof body === "object" && body !== null && !("format" in body) ? runUpdateSchema : runRecordSchema;

export const attachmentQuerySchema = z
  .object({
    kind: z.enum(["series", "spectrum"]).describe("series: first column t; spectrum: first column l"),
    filename: z.string().min(1).max(200).optional(),
  })
  .strict();

// --- claims
export const claimWriteSchema = z
  .object({
    figure: z.string().max(50).nullable().optional().meta({ example: "Fig. 3" }),
    statement: z.string().max(5000).optional(),
    record: claimRecordSchema,
  })
  .strict()
  .meta({ id: "ClaimWrite" });

export const claimUpdateSchema = claimWriteSchema
  .extend({ version: z.number().int().min(1).max(1_000_000).describe("the version you edited; 409 when the claim has moved on") })
  .meta({ id: "ClaimUpdate" });

export const claimOutSchema = z
  .object({
    id: z.uuid(),
    position: z.number().int(),
    figure: z.string().nullable(),
    statement: z.string(),
    record: claimRecordSchema,
    version: z.number().int(),
    updatedAt: when(),
  })
  .meta({ id: "Claim" });

export const checkOutputSchema = z
  .object({
    runs: z.array(z.object({ label: z.string(), derived: z.record(z.string(), z.unknown()), flags: z.array(z.record(z.string(), z.unknown())) })),
    claimFlags: z.array(z.record(z.string(), z.unknown())),
  })
  .meta({ id: "CheckOutput" });
