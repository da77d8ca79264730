import { and, eq } from "drizzle-orm";
import * as z from "zod";
import { roundRuns } from "~db/schema";
import { idParam, roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiError, apiHandle } from "~/api/errors.server";
import { ifMatchVersion, methodNotAllowed, parseBody } from "~/api/input.server";
import { runDetail } from "~/api/run-detail.server";
import { runPutSchemaFor, type runPutBodySchema } from "~/api/schemas";
import { dbContext } from "~/db.server";
import { recheckRound } from "~/workspace/recheck.server";
import { reviseRun } from "~/workspace/runs.server";
import { InvalidInput } from "~/workspace/types";
import { zodIssues } from "~/workspace/zod-issues";
import type { Route } from "./+types/run";

/** GET …/runs/:runId — the record, derived values, flags and attachments; ETag is the version. */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const { round } = await roundForApi(db, caller.userId, params, "read-runs");
    const body = await runDetail(db, round.id, params.runId);
    return Response.json(body, { headers: { etag: `"${body.version}"` } });
  });
}

/**
 * PUT …/runs/:runId — a new version of the run. The version you edited is required (If-Match
 * or expectedVersion): a stale one is 409, so two scripts cannot silently overwrite each other.
 */
export function action({ request, context, params }: Route.ActionArgs) {
  if (request.method !== "PUT") return methodNotAllowed(["GET", "PUT"]);
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "write:runs" });
    const { round } = await roundForApi(db, caller.userId, params, "write-runs");
    const runId = idParam(params.runId);
    // The run must be one of this round's: a run id from elsewhere is not found here.
    const [pointer] = await db
      .select({ runId: roundRuns.runId })
      .from(roundRuns)
      .where(and(eq(roundRuns.roundId, round.id), eq(roundRuns.runId, runId)));
    if (!pointer) throw apiError(404, "not_found", "No such run in this round.");
    const headerVersion = ifMatchVersion(request);
    const raw = await parseBody(request, z.unknown(), "");
    const parsed = runPutSchemaFor(raw).safeParse(raw);
    if (!parsed.success) {
      throw new InvalidInput("The run update is not valid: send a runproof.run/1 record, or { expectedVersion, record }.", zodIssues(parsed.error));
    }
    const value = parsed.data as z.infer<typeof runPutBodySchema>;
    const record = "record" in value ? value.record : value;
    const expectedVersion = "expectedVersion" in value ? value.expectedVersion : headerVersion;
    if (expectedVersion === undefined) {
      throw new InvalidInput("Say which version you edited.", [
        { path: "If-Match", message: 'Send If-Match: "<version>" (the ETag of GET), or a body { expectedVersion, record }.' },
      ]);
    }
    await db.transaction((tx) => reviseRun(tx, { runId, roundId: round.id, record, origin: "api", userId: caller.userId, expectedVersion }));
    await recheckRound(db, round.id);
    const body = await runDetail(db, round.id, runId);
    return Response.json(body, { headers: { etag: `"${body.version}"` } });
  });
}
