import { and, asc, eq, inArray, or, sql } from "drizzle-orm";
import { invitations, reviews, rounds, submissionMembers, submissions, venueMembers, venues } from "~db/schema";
import type { Db } from "~/workspace/types";
import { can, policyState, strongestRelation, type Action, type PolicyState, type Relation } from "./round-policy";

/** Who is asking: enough of the signed-in person to resolve relations (null when anonymous). */
export type Viewer = { id: string; email: string; role?: string | null } | null;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** Round numbers people can reach; anything else cannot name a round (and never reaches SQL). */
export const MAX_ROUND = 1000;

export function isId(value: string | undefined): value is string {
  return typeof value === "string" && UUID.test(value);
}

export function roundNumberParam(raw: string | undefined): number | null {
  if (!raw || !/^[1-9][0-9]{0,3}$/.test(raw)) return null;
  const n = Number(raw);
  return n <= MAX_ROUND ? n : null;
}

type RoundRow = typeof rounds.$inferSelect;

/** One round as one person may meet it, with the policy already bound to that person. */
export type RoundAccess = {
  relation: Relation;
  state: PolicyState;
  round: RoundRow;
  submission: { id: string; venueId: string; stage: (typeof submissions.$inferSelect)["stage"]; title: string; abstract: string; keywords: string[]; updatedAt: Date };
  venue: { id: string; name: string; blinding: "single" | "double" };
  /** The person's own report on this round, when they review it. */
  review: typeof reviews.$inferSelect | null;
  /** The person's open invitation to this round, when they have not answered it yet. */
  invitation: typeof invitations.$inferSelect | null;
  isCorresponding: boolean;
  can(action: Action): boolean;
};

export type SubmissionAccess = {
  submission: RoundAccess["submission"];
  venue: RoundAccess["venue"];
  /** Every round the person may open, oldest first. */
  rounds: RoundAccess[];
  /** Author or co-author of the submission (their working copy is theirs to see). */
  isAuthor: boolean;
};

/**
 * Resolves, in a fixed number of statements, what a person is to every round of one submission.
 * Returns null when the submission does not exist under this venue — the callers answer that
 * exactly as they answer "not yours", so existence is never revealed.
 */
export async function resolveSubmission(db: Db, viewer: Viewer, venueId: string | undefined, submissionId: string | undefined): Promise<SubmissionAccess | null> {
  if (!viewer || !isId(submissionId) || (venueId !== undefined && !isId(venueId))) return null;
  const [sub] = await db
    .select({
      id: submissions.id,
      venueId: submissions.venueId,
      stage: submissions.stage,
      title: submissions.title,
      abstract: submissions.abstract,
      keywords: submissions.keywords,
      updatedAt: submissions.updatedAt,
      venueName: venues.name,
      blinding: venues.blinding,
    })
    .from(submissions)
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(eq(submissions.id, submissionId));
  if (!sub || (venueId !== undefined && sub.venueId !== venueId)) return null;
  const [roundRows, members, editorRows] = await Promise.all([
    db.select().from(rounds).where(eq(rounds.submissionId, sub.id)).orderBy(asc(rounds.number)),
    db
      .select({ role: submissionMembers.role, corresponding: submissionMembers.corresponding })
      .from(submissionMembers)
      .where(and(eq(submissionMembers.submissionId, sub.id), eq(submissionMembers.userId, viewer.id))),
    db
      .select({ role: venueMembers.role })
      .from(venueMembers)
      .where(and(eq(venueMembers.venueId, sub.venueId), eq(venueMembers.userId, viewer.id), eq(venueMembers.role, "editor"))),
  ]);
  const roundIds = roundRows.map((r) => r.id);
  const [reviewRows, inviteRows] = roundIds.length
    ? await Promise.all([
        db.select().from(reviews).where(and(inArray(reviews.roundId, roundIds), eq(reviews.reviewerId, viewer.id))),
        db
          .select()
          .from(invitations)
          .where(
            and(
              inArray(invitations.roundId, roundIds),
              eq(invitations.state, "pending"),
              or(eq(invitations.userId, viewer.id), sql`lower(${invitations.email}) = lower(${viewer.email})`),
            ),
          ),
      ])
    : [[], []];

  const standing: Relation[] = [];
  const author = members.find((m) => m.role === "author");
  // The corresponding author sends rounds; other listed authors work as co-authors.
  if (author?.corresponding) standing.push("author");
  if ((author && !author.corresponding) || members.some((m) => m.role === "co-author")) standing.push("co-author");
  if (editorRows.length) standing.push("editor");
  if (viewer.role === "admin") standing.push("admin");
  const isAuthor = standing.includes("author") || standing.includes("co-author");

  const submission = { id: sub.id, venueId: sub.venueId, stage: sub.stage, title: sub.title, abstract: sub.abstract, keywords: sub.keywords, updatedAt: sub.updatedAt };
  const venue = { id: sub.venueId, name: sub.venueName, blinding: sub.blinding };
  const all = roundRows.map((round): RoundAccess => {
    const review = reviewRows.find((r) => r.roundId === round.id) ?? null;
    const invitation = review ? null : (inviteRows.find((i) => i.roundId === round.id) ?? null);
    const relation = strongestRelation([...standing, ...(review ? (["reviewer"] as const) : []), ...(invitation ? (["invited"] as const) : [])]);
    const state = policyState(round.state, sub.stage);
    // Authors work on their own copy; everyone else reads the manuscript as this round was sent.
    const shown =
      isAuthor && round.state === "draft"
        ? submission
        : {
            ...submission,
            title: round.sentTitle ?? sub.title,
            abstract: round.sentAbstract ?? sub.abstract,
            keywords: round.sentKeywords ?? sub.keywords,
            updatedAt: round.decidedAt ?? round.sentAt ?? round.createdAt,
          };
    return {
      relation,
      state,
      round,
      submission: shown,
      venue,
      review,
      invitation,
      isCorresponding: Boolean(author?.corresponding),
      can: (action) => can(relation, state, action, venue.blinding),
    };
  });
  const open = all.filter((r) => r.can("open-round"));
  if (!isAuthor && open.length === 0) return null;
  return { submission, venue, rounds: open, isAuthor };
}

/** One round of a submission as the person may meet it, or null (missing and forbidden alike). */
export async function resolveRound(db: Db, viewer: Viewer, params: { venueId?: string; submissionId?: string; round?: string }) {
  const number = roundNumberParam(params.round);
  if (number === null) return null;
  const found = await resolveSubmission(db, viewer, params.venueId, params.submissionId);
  return found?.rounds.find((r) => r.round.number === number) ?? null;
}

/** The submission as its header shows it: authors their working copy, others the last sent round. */
export function shownSubmission(found: SubmissionAccess) {
  if (found.isAuthor) return found.submission;
  return found.rounds.filter((r) => r.state !== "draft").at(-1)?.submission ?? found.submission;
}
