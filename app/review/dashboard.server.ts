import { and, desc, eq, inArray, isNotNull } from "drizzle-orm";
import type { Database } from "~db/client";
import { reviews, rounds, submissionMembers, submissions } from "~db/schema";

/** The reviewer's reports (open first), each linking to its workspace. */
export async function myReviews(db: Database, userId: string) {
  const rows = await db
    .select({ id: reviews.id, state: reviews.state, dueAt: reviews.dueAt, round: rounds.number, submissionId: submissions.id, title: submissions.title })
    .from(reviews)
    .innerJoin(rounds, eq(rounds.id, reviews.roundId))
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .where(and(eq(reviews.reviewerId, userId)))
    .orderBy(desc(reviews.createdAt));
  return rows
    .sort((a, b) => (a.state === b.state ? 0 : a.state === "in-progress" ? -1 : 1))
    .map((r) => ({ ...r, dueAt: r.dueAt?.toISOString().slice(0, 10) ?? null, href: `/review/${r.submissionId}/rounds/${r.round}` }));
}

/** Released decisions on the person's own submissions, newest first, each linking to its letter and remarks. */
export async function myDecisions(db: Database, userId: string) {
  const rows = await db
    .selectDistinct({ roundId: rounds.id, round: rounds.number, decision: rounds.decision, releasedAt: rounds.releasedAt, submissionId: submissions.id, venueId: submissions.venueId, title: submissions.title })
    .from(submissionMembers)
    .innerJoin(submissions, eq(submissions.id, submissionMembers.submissionId))
    .innerJoin(rounds, eq(rounds.submissionId, submissions.id))
    .where(and(eq(submissionMembers.userId, userId), inArray(submissionMembers.role, ["author", "co-author"]), isNotNull(rounds.releasedAt)))
    .orderBy(desc(rounds.releasedAt))
    .limit(10);
  return rows.map((r) => ({ ...r, releasedAt: r.releasedAt!.toISOString().slice(0, 10), href: `/venues/${r.venueId}/submissions/${r.submissionId}/rounds/${r.round}/decision` }));
}
