import { and, asc, eq, inArray } from "drizzle-orm";
import type { Database } from "~db/client";
import { contributors, reviews, rounds } from "~db/schema";
import { submissionForCaller } from "~/api/access.server";
import { requireApiCaller } from "~/api/auth.server";
import { apiError, apiHandle } from "~/api/errors.server";
import { iso } from "~/api/views.server";
import { methodNotAllowed } from "~/api/input.server";
import { dbContext } from "~/db.server";
import type { Route } from "./+types/submission";

/** GET /api/v1/submissions/:submissionId, with the rounds the caller may read. */
export function loader({ request, context, params }: Route.LoaderArgs) {
  return apiHandle(async () => {
    const db = context.get(dbContext);
    const caller = await requireApiCaller(request, db, { scope: "read" });
    const access = await submissionForCaller(db, caller.userId, params.submissionId);
    const { submission } = access;
    const roundRows = await db.select().from(rounds).where(eq(rounds.submissionId, submission.id)).orderBy(asc(rounds.number));
    // Reviewers get the rounds they review only; editors the rounds sent to them.
    const reviewed = access.isAuthor ? [] : await reviewedRoundIds(db, caller.userId, roundRows.map((r) => r.id));
    const visible = roundRows.filter(
      (r) => access.isAuthor || (access.roles.includes("editor") && r.state !== "draft") || reviewed.includes(r.id),
    );
    // As on the pages: to anyone but its authors, a submission with no round they may read does not exist.
    if (!access.isAuthor && visible.length === 0) throw apiError(404, "not_found", "No such submission, or you have no access to it.");
    // Double-blind: a reviewer never receives author names or affiliations.
    const people = access.authorsHidden
      ? null
      : await db
          .select({ position: contributors.position, name: contributors.name, affiliation: contributors.affiliation })
          .from(contributors)
          .where(eq(contributors.submissionId, submission.id))
          .orderBy(asc(contributors.position));
    return Response.json({
      id: submission.id,
      title: submission.title,
      stage: submission.stage,
      venue: { id: submission.venueId, name: submission.venueName, blinding: submission.blinding },
      roles: access.roles,
      updatedAt: submission.updatedAt.toISOString(),
      abstract: submission.abstract,
      keywords: submission.keywords,
      contributors: people,
      rounds: visible.map((r) => ({ number: r.number, state: r.state, sentAt: iso(r.sentAt), checkedAt: iso(r.checkedAt) })),
    });
  });
}

async function reviewedRoundIds(db: Database, userId: string, roundIds: string[]) {
  if (roundIds.length === 0) return [];
  const rows = await db
    .select({ roundId: reviews.roundId })
    .from(reviews)
    .where(and(eq(reviews.reviewerId, userId), inArray(reviews.roundId, roundIds)));
  return rows.map((r) => r.roundId);
}

export function action() {
  return methodNotAllowed(["GET"]);
}
