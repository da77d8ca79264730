import { href } from "react-router";
import { and, desc, eq, inArray, isNotNull, or, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, reviews, rounds, submissionMembers, submissions, venues } from "~db/schema";

/** The reviewer's reports (open first), each linking to its workspace. */
export async function myReviews(db: Database, userId: string) {
  const rows = await db
    .select({ id: reviews.id, state: reviews.state, dueAt: reviews.dueAt, round: rounds.number, submissionId: submissions.id, venueId: submissions.venueId, title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})` })
    .from(reviews)
    .innerJoin(rounds, eq(rounds.id, reviews.roundId))
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .where(and(eq(reviews.reviewerId, userId)))
    .orderBy(desc(reviews.createdAt));
  return rows
    .sort((a, b) => (a.state === b.state ? 0 : a.state === "in-progress" ? -1 : 1))
    .map((r) => ({ ...r, dueAt: r.dueAt?.toISOString().slice(0, 10) ?? null, href: href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.round) }) }));
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
  return rows.map((r) => ({ ...r, releasedAt: r.releasedAt!.toISOString().slice(0, 10), href: href("/venues/:venueId/submissions/:submissionId/rounds/:round/decision", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.round) }) }));
}

/** Invitations the person has not answered yet, on rounds still open, each with its review page. */
export async function myInvitations(db: Database, person: { id: string; email: string }) {
  const rows = await db
    .select({
      id: invitations.id,
      dueAt: invitations.dueAt,
      round: rounds.number,
      submissionId: submissions.id,
      venueId: submissions.venueId,
      venueName: venues.name,
      title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})`,
    })
    .from(invitations)
    .innerJoin(rounds, eq(rounds.id, invitations.roundId))
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(
      and(
        eq(invitations.state, "pending"),
        inArray(rounds.state, ["sent", "under-review", "reviews-in"]),
        or(eq(invitations.userId, person.id), sql`lower(${invitations.email}) = lower(${person.email})`),
      ),
    )
    .orderBy(desc(invitations.createdAt))
    .limit(50);
  return rows.map((r) => ({
    ...r,
    dueAt: r.dueAt.toISOString().slice(0, 10),
    href: href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.round) }),
  }));
}
