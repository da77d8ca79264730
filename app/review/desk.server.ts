export { QUEUE_GROUPS } from "./states";
import { and, desc, eq, ne, sql } from "drizzle-orm";
import { flags, invitations, reviews, rounds, submissions } from "~db/schema";
import type { Db } from "~/workspace/types";

/** Every sent round of the venue with its flag counts and where its reviews stand. */
export async function deskQueue(db: Db, venueId: string) {
  return db
    .select({
      roundId: rounds.id,
      number: rounds.number,
      state: rounds.state,
      sentAt: rounds.sentAt,
      decision: rounds.decision,
      submissionId: submissions.id,
      title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})`,
      mismatch: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'mismatch')`,
      caution: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'caution')`,
      note: sql<number>`(select count(*)::int from ${flags} where ${flags.roundId} = ${rounds.id} and ${flags.severity} = 'note')`,
      invited: sql<number>`(select count(*)::int from ${invitations} where ${invitations.roundId} = ${rounds.id} and ${invitations.state} = 'pending')`,
      reviewing: sql<number>`(select count(*)::int from ${reviews} where ${reviews.roundId} = ${rounds.id} and ${reviews.state} = 'in-progress')`,
      submitted: sql<number>`(select count(*)::int from ${reviews} where ${reviews.roundId} = ${rounds.id} and ${reviews.state} = 'submitted')`,
    })
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .where(and(eq(submissions.venueId, venueId), ne(rounds.state, "draft")))
    .orderBy(desc(rounds.sentAt));
}
