import { href } from "react-router";
import { and, asc, count, desc, eq, inArray, isNotNull, lt, or, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, reviews, rounds, submissionMembers, submissions, venues } from "~db/schema";

/** Reports per page of "Your reviews"; older ones page in with a cursor. */
export const MY_REVIEWS_PAGE_SIZE = 20;

const REVIEW_CURSOR = /^([01])_(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(?:\.\d+)?Z)_([0-9a-f-]{36})$/i;
/** A cursor from the URL (rank, created time, id of the last report shown); anything else starts at the top. */
export function parseReviewCursor(value: string | null) {
  const m = value ? REVIEW_CURSOR.exec(value) : null;
  return m && !Number.isNaN(Date.parse(m[2]!)) ? { rank: Number(m[1]), createdAt: new Date(m[2]!), id: m[3]! } : null;
}

/**
 * The reviewer's reports, open ones first and then newest first, each linking to its workspace.
 * Keyset-paged on (open?, created, id), so a page costs the same however many reports there are.
 */
export async function myReviews(db: Database, userId: string, cursor: ReturnType<typeof parseReviewCursor> = null) {
  const rank = sql<number>`(case when ${reviews.state} = 'in-progress' then 0 else 1 end)::int`;
  const mine = eq(reviews.reviewerId, userId);
  const after = cursor
    ? or(
        sql`${rank} > ${cursor.rank}`,
        and(sql`${rank} = ${cursor.rank}`, or(lt(reviews.createdAt, cursor.createdAt), and(eq(reviews.createdAt, cursor.createdAt), lt(reviews.id, cursor.id)))),
      )
    : undefined;
  const [rows, [total]] = await Promise.all([
    db
      .select({ id: reviews.id, state: reviews.state, dueAt: reviews.dueAt, createdAt: reviews.createdAt, rank, round: rounds.number, submissionId: submissions.id, venueId: submissions.venueId, title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})` })
      .from(reviews)
      .innerJoin(rounds, eq(rounds.id, reviews.roundId))
      .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
      .where(and(mine, after))
      .orderBy(asc(rank), desc(reviews.createdAt), desc(reviews.id))
      .limit(MY_REVIEWS_PAGE_SIZE + 1),
    db.select({ n: count() }).from(reviews).where(mine),
  ]);
  const items = rows.slice(0, MY_REVIEWS_PAGE_SIZE);
  const last = items[items.length - 1];
  return {
    total: total?.n ?? 0,
    next: rows.length > MY_REVIEWS_PAGE_SIZE && last ? `${last.rank}_${last.createdAt.toISOString()}_${last.id}` : null,
    items: items.map(({ createdAt: _c, rank: _r, ...r }) => ({
      ...r,
      dueAt: r.dueAt?.toISOString().slice(0, 10) ?? null,
      href: href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.round) }),
    })),
  };
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
