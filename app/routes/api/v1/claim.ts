import { and, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { claims } from "~db/schema";
import { idParam, roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiError, apiHandle } from "~/api/errors.server";
import { methodNotAllowed, parseBody } from "~/api/input.server";
import { claimUpdateSchema } from "~/api/schemas";
import { claimOut } from "~/api/api-views.server";
import { dbContext } from "~/db.server";
import { updateClaim } from "~/workspace/claims.server";
import { requestRecheck } from "~/workspace/recheck.server";
import type { Route } from "./+types/claim";

async function claimOfRound(db: Database, roundId: string, claimId: string | undefined) {
  const [row] = await db.select().from(claims).where(and(eq(claims.id, idParam(claimId)), eq(claims.roundId, roundId)));
  if (!row) throw apiError(404, "not_found", "No such claim in this round.");
  return row;
}

/** GET …/claims/:claimId */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const { round } = await roundForApi(db, caller.userId, params, "read-claims");
    const row = await claimOfRound(db, round.id, params.claimId);
    return Response.json(claimOut(row), { headers: { etag: `"${row.version}"` } });
  });
}

/** PUT …/claims/:claimId — applies only to the version you edited (`version`); else 409. */
export function action({ request, context, params }: Route.ActionArgs) {
  if (request.method !== "PUT") return methodNotAllowed(["GET", "PUT"]);
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "write:runs" });
    const { round } = await roundForApi(db, caller.userId, params, "write-claims");
    await claimOfRound(db, round.id, params.claimId);
    const body = await parseBody(request, claimUpdateSchema, "The claim update is not valid.");
    const row = await updateClaim(db, round.id, params.claimId!, body.version, body);
    await requestRecheck(db, round.id);
    return Response.json(claimOut(row), { headers: { etag: `"${row.version}"` } });
  });
}
