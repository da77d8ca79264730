import { desc, eq, inArray, or } from "drizzle-orm";
import { submissionMembers, submissions, venueMembers } from "~db/schema";
import { submissionForApi } from "~/access/api-guards.server";
import { shownSubmission } from "~/access/relation.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { methodNotAllowed } from "~/api/input.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/submissions";

/** The list answers at most this many submissions, most recently changed first. */
const LIST_LIMIT = 100;

/** GET /api/v1/submissions: the submissions with a round you may open, as you may see them. */
export function loader({ request, context }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const memberOf = db.select({ id: submissionMembers.submissionId }).from(submissionMembers).where(eq(submissionMembers.userId, caller.userId));
    const editorOf = db.select({ id: venueMembers.venueId }).from(venueMembers).where(eq(venueMembers.userId, caller.userId));
    const candidates = await db
      .select({ id: submissions.id })
      .from(submissions)
      .where(or(inArray(submissions.id, memberOf), inArray(submissions.venueId, editorOf)))
      .orderBy(desc(submissions.updatedAt))
      .limit(LIST_LIMIT);
    const found = await Promise.all(candidates.map((c) => submissionForApi(db, caller.userId, c.id).catch(() => null)));
    const items = found
      .filter((f) => f !== null)
      .map((f) => {
        const shown = shownSubmission(f);
        return {
          id: f.submission.id,
          title: shown.title,
          stage: f.submission.stage,
          venue: f.venue,
          roles: [...new Set(f.rounds.map((r) => r.relation))],
          updatedAt: shown.updatedAt.toISOString(),
        };
      });
    return Response.json({ items });
  });
}

export function action() {
  return methodNotAllowed(["GET"]);
}
