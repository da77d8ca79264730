import { and, eq } from "drizzle-orm";
import { reviews, rounds, submissionMembers, submissions, venueMembers, venues } from "~db/schema";
import { assertDraft } from "~/workspace/rounds.server";
import type { Db } from "~/workspace/types";
import { apiError } from "./errors.server";

export type ApiRole = "author" | "co-author" | "reviewer" | "editor";

const notFound = () => apiError(404, "not_found", "No such submission or round, or you have no access to it.");

/**
 * The same rules as the pages, applied to an API caller. A submission the caller holds no role
 * on is a 404 (its existence is not revealed).
 */
export async function submissionForCaller(db: Db, userId: string, submissionId: string) {
  if (!/^[0-9a-f-]{36}$/i.test(submissionId)) throw notFound();
  const [submission] = await db
    .select({
      id: submissions.id,
      venueId: submissions.venueId,
      title: submissions.title,
      abstract: submissions.abstract,
      keywords: submissions.keywords,
      stage: submissions.stage,
      createdAt: submissions.createdAt,
      updatedAt: submissions.updatedAt,
      venueName: venues.name,
      blinding: venues.blinding,
    })
    .from(submissions)
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(eq(submissions.id, submissionId));
  if (!submission) throw notFound();
  const members = await db
    .select({ role: submissionMembers.role })
    .from(submissionMembers)
    .where(and(eq(submissionMembers.submissionId, submissionId), eq(submissionMembers.userId, userId)));
  const roles: ApiRole[] = members.map((m) => m.role);
  const [editor] = await db
    .select({ role: venueMembers.role })
    .from(venueMembers)
    .where(and(eq(venueMembers.venueId, submission.venueId), eq(venueMembers.userId, userId), eq(venueMembers.role, "editor")));
  if (editor) roles.push("editor");
  if (roles.length === 0) throw notFound();
  const isAuthor = roles.includes("author") || roles.includes("co-author");
  /** A reviewer who is nothing else on a double-blind venue never sees who wrote the manuscript. */
  const authorsHidden = !isAuthor && !roles.includes("editor") && submission.blinding === "double";
  return { submission, roles, isAuthor, authorsHidden };
}

export type SubmissionAccess = Awaited<ReturnType<typeof submissionForCaller>>;

/**
 * A round the caller may read: authors and co-authors read every round of their submission,
 * reviewers the rounds they review (a `reviews` row), editors the rounds sent to them.
 * `write` additionally needs an author role (else 403) and a draft round (else 409).
 */
export async function roundForCaller(db: Db, userId: string, submissionId: string, roundParam: string | undefined, mode: "read" | "write") {
  const access = await submissionForCaller(db, userId, submissionId);
  const number = Number(roundParam);
  if (!Number.isInteger(number) || number < 1) throw notFound();
  const [round] = await db
    .select()
    .from(rounds)
    .where(and(eq(rounds.submissionId, submissionId), eq(rounds.number, number)));
  if (!round) throw notFound();
  let readable = access.isAuthor;
  if (!readable && access.roles.includes("editor")) readable = round.state !== "draft";
  if (!readable && access.roles.includes("reviewer")) {
    const [review] = await db
      .select({ id: reviews.id })
      .from(reviews)
      .where(and(eq(reviews.roundId, round.id), eq(reviews.reviewerId, userId)));
    readable = Boolean(review);
  }
  if (!readable) throw notFound();
  if (mode === "write") {
    if (!access.isAuthor) {
      throw apiError(403, "forbidden", "Only the authors of the submission change its rounds; you may read this one.");
    }
    assertDraft(round);
  }
  return { ...access, round };
}

/** Path ids are UUIDs; anything else cannot name a row (404, and never a database error). */
export function idParam(value: string | undefined): string {
  if (!value || !/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value)) {
    throw apiError(404, "not_found", "No such object: the id in the address is not a valid id.");
  }
  return value;
}
