import { and, asc, eq } from "drizzle-orm";
import { contributors, rounds, submissionMembers, submissions, user, venues } from "~db/schema";
import type { Database } from "~db/client";
import { audit } from "./audit.server";
import type { SubmissionFields } from "./submission-form";

/** A new submission with its corresponding author listed and round 1 open, in one transaction. */
export async function createSubmission(db: Database, opts: { venueId: string; userId: string; fields: SubmissionFields }) {
  return db.transaction(async (tx) => {
    const [me] = await tx.select({ name: user.name, email: user.email, affiliation: user.affiliation, orcid: user.orcid }).from(user).where(eq(user.id, opts.userId));
    const [sub] = await tx
      .insert(submissions)
      .values({ venueId: opts.venueId, createdBy: opts.userId, ...opts.fields })
      .returning({ id: submissions.id });
    await tx.insert(submissionMembers).values({ submissionId: sub!.id, userId: opts.userId, role: "author", corresponding: true });
    await tx.insert(contributors).values({
      submissionId: sub!.id,
      userId: opts.userId,
      position: 1,
      name: me!.name,
      email: me!.email,
      affiliation: me!.affiliation ?? "",
      orcid: me!.orcid ?? null,
      corresponding: true,
    });
    const [round] = await tx.insert(rounds).values({ submissionId: sub!.id, number: 1 }).returning({ number: rounds.number });
    await audit(tx, sub!.id, opts.userId, "submission.created", {});
    return { submissionId: sub!.id, round: round!.number };
  });
}

export async function updateSubmission(db: Database, submissionId: string, fields: SubmissionFields) {
  await db.update(submissions).set({ ...fields, updatedAt: new Date() }).where(eq(submissions.id, submissionId));
}

/** What the submission header shows. */
export async function submissionHeader(db: Database, submissionId: string) {
  const [sub] = await db
    .select({
      id: submissions.id,
      title: submissions.title,
      abstract: submissions.abstract,
      keywords: submissions.keywords,
      availability: submissions.availability,
      dois: submissions.dois,
      stage: submissions.stage,
      manuscriptFileId: submissions.manuscriptFileId,
      venueId: venues.id,
      venueName: venues.name,
      blinding: venues.blinding,
    })
    .from(submissions)
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(eq(submissions.id, submissionId));
  const roundRows = await db
    .select({ number: rounds.number, state: rounds.state })
    .from(rounds)
    .where(eq(rounds.submissionId, submissionId))
    .orderBy(asc(rounds.number));
  return { submission: sub!, rounds: roundRows };
}

export async function submissionContributors(db: Database, submissionId: string) {
  return db
    .select({
      id: contributors.id,
      name: contributors.name,
      email: contributors.email,
      affiliation: contributors.affiliation,
      orcid: contributors.orcid,
      creditRoles: contributors.creditRoles,
      corresponding: contributors.corresponding,
      joined: contributors.userId,
      invitedAt: contributors.invitedAt,
    })
    .from(contributors)
    .where(and(eq(contributors.submissionId, submissionId)))
    .orderBy(asc(contributors.position));
}

/** Venues a person may submit to: every venue of the instance accepts submissions. */
export async function openVenues(db: Database) {
  return db.select({ id: venues.id, name: venues.name }).from(venues).orderBy(asc(venues.name));
}
