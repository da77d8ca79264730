import { asc, eq } from "drizzle-orm";
import { contributors } from "~db/schema";
import { submissionForApi } from "~/access/api-guards.server";
import { shownSubmission } from "~/access/relation.server";
import { requireApiCaller } from "~/api/caller.server";
import { apiHandle } from "~/api/errors.server";
import { iso } from "~/api/api-views.server";
import { methodNotAllowed } from "~/api/input.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/submission";

/**
 * GET /api/v1/submissions/:submissionId, with the rounds the caller may open. Authors read their
 * working copy; everyone else the manuscript as last sent (a draft never leaves the authors).
 */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const found = await submissionForApi(db, caller.userId, params.submissionId);
    const shown = shownSubmission(found);
    const latest = found.rounds.at(-1)!;
    // Double-blind: a reviewer never receives author names or affiliations.
    const people = !latest.can("read-author-identities")
      ? null
      : found.isAuthor
        ? await db
            .select({ position: contributors.position, name: contributors.name, affiliation: contributors.affiliation })
            .from(contributors)
            .where(eq(contributors.submissionId, found.submission.id))
            .orderBy(asc(contributors.position))
        : (found.rounds.filter((r) => r.state !== "draft").at(-1)?.round.sentContributors ?? []).map((c) => ({ position: c.position, name: c.name, affiliation: c.affiliation }));
    return Response.json({
      id: found.submission.id,
      title: shown.title,
      stage: found.submission.stage,
      venue: found.venue,
      roles: [...new Set(found.rounds.map((r) => r.relation))],
      updatedAt: shown.updatedAt.toISOString(),
      abstract: shown.abstract,
      keywords: shown.keywords,
      contributors: people,
      rounds: found.rounds.map((r) => ({ number: r.round.number, state: r.round.state, sentAt: iso(r.round.sentAt), checkedAt: iso(r.round.checkedAt) })),
    });
  });
}

export function action() {
  return methodNotAllowed(["GET"]);
}
