import { and, eq } from "drizzle-orm";
import { attachments, roundRuns, storedFiles } from "~db/schema";
import { idParam, roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiError, apiHandle } from "~/api/errors.server";
import { methodNotAllowed, parseQuery } from "~/api/input.server";
import { attachmentQuerySchema } from "~/api/schemas";
import { env } from "~/config/env.server";
import { dbContext } from "~/db.server";
import { attachCsv } from "~/workspace/attachments.server";
import type { Route } from "./+types/attachments";

/**
 * POST …/runs/:runId/attachments?kind=series|spectrum — the CSV is the request body (text/csv).
 * It is streamed to storage and the parser chunk by chunk; the size limit (UPLOAD_LIMIT_MB)
 * stops the read as soon as it is passed. The round is re-checked before the answer.
 */
export function action({ request, context, params }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed(["POST"]);
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "write:runs" });
    const { round } = await roundForApi(db, caller.userId, params, "write-runs");
    const runId = idParam(params.runId);
    const query = parseQuery(request, attachmentQuerySchema);
    const limitBytes = env.UPLOAD_LIMIT_MB * 1024 * 1024;
    if (Number(request.headers.get("content-length") ?? "0") > limitBytes) {
      throw apiError(413, "body_too_large", `The file is larger than the upload limit of ${env.UPLOAD_LIMIT_MB} MB; nothing was stored.`);
    }
    if (!request.body) throw apiError(400, "empty_body", "Send the CSV file as the request body (Content-Type: text/csv).");
    const [pointer] = await db
      .select({ runId: roundRuns.runId })
      .from(roundRuns)
      .where(and(eq(roundRuns.roundId, round.id), eq(roundRuns.runId, runId)));
    if (!pointer) throw apiError(404, "not_found", "No such run in this round.");
    const filename = query.filename ?? `${query.kind}.csv`;
    const stored = await attachCsv(db, { roundId: round.id, runId, kind: query.kind, body: request.body, filename, userId: caller.userId, limitBytes });
    const [row] = await db
      .select({ id: attachments.id, kind: attachments.kind, filename: storedFiles.filename, columns: attachments.columns, rowCount: attachments.rowCount, createdAt: attachments.createdAt })
      .from(attachments)
      .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
      .where(eq(attachments.id, stored.attachmentId));
    return Response.json({ ...row!, createdAt: row!.createdAt.toISOString() }, { status: 201 });
  });
}

export function loader() {
  return methodNotAllowed(["POST"]);
}
