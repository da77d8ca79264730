import { roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { methodNotAllowed, parseBody, parseQuery } from "~/api/input.server";
import { runsQuerySchema } from "~/api/schemas";
import { runDetail } from "~/api/run-detail.server";
import { runPage } from "~/api/run-list.server";
import { runSchema } from "~/checker/schema";
import { dbContext } from "~/db.server";
import { recheckRound } from "~/workspace/recheck.server";
import { createRun } from "~/workspace/runs.server";
import type { Route } from "./+types/runs";

/**
 * GET …/rounds/:round/runs — the round's runs, one page at a time, sorted by label, version,
 * last change, flag counts or any column of the runs table. The app's runs table pages and
 * sorts through this route with a fetcher (session cookie).
 */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const query = parseQuery(request, runsQuerySchema);
    const { round } = await roundForApi(db, caller.userId, params, "read-runs");
    return Response.json(await runPage(db, round.id, query));
  });
}

/** POST …/rounds/:round/runs — a new run from a `runproof.run/1` record; the round is re-checked. */
export function action({ request, context, params }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed(["GET", "POST"]);
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "write:runs" });
    const { round, submission } = await roundForApi(db, caller.userId, params, "write-runs");
    const record = await parseBody(request, runSchema, "The run record does not follow runproof.run/1.");
    const created = await db.transaction((tx) =>
      createRun(tx, { submissionId: submission.id, roundId: round.id, record, origin: "api", userId: caller.userId }),
    );
    await recheckRound(db, round.id);
    const body = await runDetail(db, round.id, created.run.id);
    return Response.json(body, { status: 201, headers: { etag: `"${body.version}"`, location: `${new URL(request.url).pathname}/${created.run.id}` } });
  });
}
