import { and, asc, eq, type SQL } from "drizzle-orm";
import { flags } from "~db/schema";
import { roundForApi } from "~/access/api-guards.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { methodNotAllowed, parseQuery } from "~/api/input.server";
import { flagsQuerySchema } from "~/api/schemas";
import { ADVISORY, flagOut } from "~/api/api-views.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/flags";

/** GET …/rounds/:round/flags?severity=&rule=&run=&claim= — the round's stored flags. */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const query = parseQuery(request, flagsQuerySchema);
    const { round } = await roundForApi(db, caller.userId, params, "read-flags");
    const where: SQL[] = [eq(flags.roundId, round.id)];
    if (query.severity) where.push(eq(flags.severity, query.severity));
    if (query.rule) where.push(eq(flags.rule, query.rule));
    if (query.run) where.push(eq(flags.runLabel, query.run));
    if (query.claim) where.push(eq(flags.claimId, query.claim));
    const rows = await db.select().from(flags).where(and(...where)).orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel));
    return Response.json({ items: rows.map(flagOut), advisory: ADVISORY });
  });
}

export function action() {
  return methodNotAllowed(["GET"]);
}
