/**
 * The OpenAPI 3.1 document of /api/v1, built by zod-openapi from the schemas the routes parse
 * with (app/api/schemas.ts and the checker's own). unit/api/openapi.test.ts fails when a route
 * in app/routes.ts under /api/v1/ is missing here.
 */
import * as z from "zod";
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject } from "zod-openapi";
import * as s from "./schemas";

const json = (schema: z.ZodType) => ({ content: { "application/json": { schema } } });
const ok = (description: string, schema: z.ZodType) => ({ description, ...json(schema) });
const err = (description: string) => ({ description, ...json(s.errorSchema) });

const READ_ERRORS = {
  "401": err("No token, or an unknown, revoked or expired one."),
  "403": err("The token lacks the scope this call needs."),
  "404": err("No such object, or you have no access to it (existence is not revealed)."),
  "429": err("Over the per-token rate limit; see Retry-After."),
};
const WRITE_ERRORS = {
  ...READ_ERRORS,
  "400": err("The input is not valid; `details` name each problem by its JSON path."),
  "403": err("The token lacks write:runs, or you may read but not change this round."),
  "409": err("The round was sent (frozen), or the object changed since the version you edited."),
  "413": err("The body is larger than the limit."),
};

const read = (summary: string, response: z.ZodType, extra: Partial<ZodOpenApiOperationObject> = {}): ZodOpenApiOperationObject => ({
  summary,
  security: [{ bearer: [] }, { session: [] }],
  responses: { "200": ok(summary, response), ...READ_ERRORS },
  ...extra,
});
const write = (summary: string, status: "200" | "201", response: z.ZodType, extra: Partial<ZodOpenApiOperationObject>): ZodOpenApiOperationObject => ({
  summary,
  security: [{ bearer: [] }],
  responses: { [status]: ok(summary, response), ...WRITE_ERRORS },
  ...extra,
});

const base = "/api/v1/submissions/{submissionId}/rounds/{round}";
const ifMatch = z.object({ "if-match": z.string().optional().describe('the version you edited, e.g. "3"') });

export const apiPaths: ZodOpenApiPathsObject = {
  "/api/v1/submissions": {
    get: read("The submissions you hold a role on", z.object({ items: z.array(s.submissionSummarySchema) })),
  },
  "/api/v1/submissions/{submissionId}": {
    get: read("One submission with the rounds you may read", s.submissionSchema, { requestParams: { path: s.submissionParams } }),
  },
  [base]: {
    get: read("One round: state and counts", s.roundSchema, { requestParams: { path: s.roundParams } }),
  },
  [`${base}/runs`]: {
    get: read("The round's runs, paged and sorted", s.runListSchema, { requestParams: { path: s.roundParams, query: s.runsQuerySchema } }),
    post: write("Add a run from a runproof.run/1 record", "201", s.runSchemaOut, {
      requestParams: { path: s.roundParams },
      requestBody: { required: true, ...json(s.runRecordSchema) },
    }),
  },
  [`${base}/runs/{runId}`]: {
    get: read("One run with derived values, flags and attachments", s.runSchemaOut, { requestParams: { path: s.runParams } }),
    put: write("A new version of the run (If-Match or expectedVersion required)", "200", s.runSchemaOut, {
      requestParams: { path: s.runParams, header: ifMatch },
      requestBody: { required: true, ...json(s.runPutBodySchema) },
    }),
  },
  [`${base}/runs/{runId}/attachments`]: {
    post: write("Attach a time-series or spectrum CSV to the run (streamed)", "201", s.attachmentSchema, {
      requestParams: { path: s.runParams, query: s.attachmentQuerySchema },
      requestBody: { required: true, content: { "text/csv": { schema: z.string().describe("CSV with a header row; first column t (series) or l (spectrum)") } } },
    }),
  },
  [`${base}/claims`]: {
    get: read("The round's claims", z.object({ items: z.array(s.claimOutSchema) }), { requestParams: { path: s.roundParams } }),
    post: write("Add a claim", "201", s.claimOutSchema, { requestParams: { path: s.roundParams }, requestBody: { required: true, ...json(s.claimWriteSchema) } }),
  },
  [`${base}/claims/{claimId}`]: {
    get: read("One claim", s.claimOutSchema, { requestParams: { path: s.claimParams } }),
    put: write("Change a claim (version required; 409 when stale)", "200", s.claimOutSchema, {
      requestParams: { path: s.claimParams },
      requestBody: { required: true, ...json(s.claimUpdateSchema) },
    }),
  },
  [`${base}/flags`]: {
    get: read("The round's flags, filtered", s.flagListSchema, { requestParams: { path: s.roundParams, query: s.flagsQuerySchema } }),
  },
  "/api/v1/check": {
    post: {
      summary: "Check run records and a claim without storing anything (no token needed)",
      requestBody: { required: true, ...json(s.checkRequestSchema) },
      responses: {
        "200": ok("Derived values and flags", s.checkOutputSchema),
        "400": err("Invalid input"),
        "413": err("Body too large"),
        "422": err("Too large to check: the input needed more memory or time than one check may use"),
        "503": err("Every checker thread is busy (Retry-After)"),
      },
    },
  },
  "/api/v1/openapi.json": {
    get: { summary: "This document", responses: { "200": { description: "OpenAPI 3.1 document", content: { "application/json": { schema: z.record(z.string(), z.unknown()) } } } } },
  },
};

let cached: ReturnType<typeof createDocument> | undefined;

export function openApiDocument() {
  cached ??= createDocument({
    openapi: "3.1.0",
    info: {
      title: "Runproof API",
      version: "1.0.0",
      description:
        "Push run records, series and claims to a draft round and read rounds, runs and flags. Authenticate with a personal token from your account page (`Authorization: Bearer rp_…`). Errors are always `{ error: { code, message, details } }`. Flags are advisory: computed from what the authors entered, under the conventions they declared; the reviewer's judgement decides.",
    },
    components: {
      securitySchemes: {
        bearer: { type: "http", scheme: "bearer", description: "Personal API token (rp_…), scopes read and write:runs" },
        session: { type: "apiKey", in: "cookie", name: "better-auth.session_token", description: "The app's own pages, GET only" },
      },
    },
    paths: apiPaths,
  });
  return cached;
}
