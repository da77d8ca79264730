import { roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { claimOut } from "~/api/api-views.server";
import { methodNotAllowed, parseBody } from "~/api/input.server";
import { claimWriteSchema } from "~/api/schemas";
import { dbContext } from "~/db.server";
import { createClaim, roundClaims } from "~/workspace/claims.server";
import { requestRecheck } from "~/workspace/recheck.server";
import type { Route } from "./+types/claims";

/** GET …/rounds/:round/claims — the round's claims in manuscript order. */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const { round } = await roundForApi(db, caller.userId, params, "read-claims");
    return Response.json({ items: (await roundClaims(db, round.id)).map(claimOut) });
  });
}

/** POST …/rounds/:round/claims — a new claim (`runproof.claim/1` with figure and statement). */
export function action({ request, context, params }: Route.ActionArgs) {
  if (request.method !== "POST") return methodNotAllowed(["GET", "POST"]);
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "write:runs" });
    const { round } = await roundForApi(db, caller.userId, params, "write-claims");
    const body = await parseBody(request, claimWriteSchema, "The claim is not valid.");
    const row = await createClaim(db, round.id, body);
    await requestRecheck(db, round.id);
    return Response.json(claimOut(row), { status: 201, headers: { etag: `"${row.version}"` } });
  });
}
