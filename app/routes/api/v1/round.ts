import { count, eq } from "drizzle-orm";
import { claims, roundRuns } from "~db/schema";
import { roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { methodNotAllowed } from "~/api/input.server";
import { flagCountsByRun, iso } from "~/api/api-views.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/round";

/** GET /api/v1/submissions/:submissionId/rounds/:round — state and counts of one round. */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const { round } = await roundForApi(db, caller.userId, params, "open-round");
    const [[runs], [claimCount], counts] = await Promise.all([
      db.select({ n: count() }).from(roundRuns).where(eq(roundRuns.roundId, round.id)),
      db.select({ n: count() }).from(claims).where(eq(claims.roundId, round.id)),
      flagCountsByRun(db, round.id),
    ]);
    return Response.json({
      submissionId: round.submissionId,
      number: round.number,
      state: round.state,
      version: round.version,
      sentAt: iso(round.sentAt),
      checkedAt: iso(round.checkedAt),
      checkError: round.checkError ?? null,
      runCount: runs?.n ?? 0,
      claimCount: claimCount?.n ?? 0,
      flagCounts: counts.total,
      checking: round.checkedSeq < round.changeSeq,
    });
  });
}

export function action() {
  return methodNotAllowed(["GET"]);
}
