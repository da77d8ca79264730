import { and, eq, inArray, sql } from "drizzle-orm";
import { data } from "react-router";
import { contributors, rounds, submissionMembers, submissions, user, venueMembers, venues } from "~db/schema";
import type { Db } from "~/workspace/types";

/** A round with its submission and venue, or a 404 that reveals nothing. */
export async function roundContext(db: Db, where: { roundId: string } | { submissionId: string; number: number }) {
  const cond = "roundId" in where ? eq(rounds.id, where.roundId) : and(eq(rounds.submissionId, where.submissionId), eq(rounds.number, where.number));
  const [row] = await db
    .select({
      round: rounds,
      submission: { id: submissions.id, title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})`, stage: submissions.stage, venueId: submissions.venueId },
      venue: { id: venues.id, name: venues.name, blinding: venues.blinding },
    })
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(cond);
  if (!row) throw data("Not found", { status: 404 });
  return row;
}
export type RoundContext = Awaited<ReturnType<typeof roundContext>>;

export async function venueEditors(db: Db, venueId: string) {
  return db
    .select({ id: user.id, email: user.email, name: user.name })
    .from(venueMembers)
    .innerJoin(user, eq(user.id, venueMembers.userId))
    .where(and(eq(venueMembers.venueId, venueId), eq(venueMembers.role, "editor")));
}

/** Authors and co-authors with accounts: the people who get decisions and digests. */
export async function submissionAuthors(db: Db, submissionId: string) {
  return db
    .selectDistinct({ id: user.id, email: user.email, name: user.name, affiliation: user.affiliation })
    .from(submissionMembers)
    .innerJoin(user, eq(user.id, submissionMembers.userId))
    .where(and(eq(submissionMembers.submissionId, submissionId), inArray(submissionMembers.role, ["author", "co-author"])));
}

/** Everyone listed on the submission (with or without an account), for the conflict guard. */
export async function listedPeople(db: Db, submissionId: string) {
  const [members, listed] = await Promise.all([
    submissionAuthors(db, submissionId),
    db.select({ email: contributors.email, name: contributors.name, affiliation: contributors.affiliation }).from(contributors).where(eq(contributors.submissionId, submissionId)),
  ]);
  return [...members.map((m) => ({ email: m.email, name: m.name, affiliation: m.affiliation ?? "" })), ...listed];
}
