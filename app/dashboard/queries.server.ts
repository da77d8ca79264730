import { and, desc, eq, inArray, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { rounds, submissionMembers, submissions, venueMembers, venues } from "~db/schema";

export type DashboardItem = { id: string; title: string; stage: string; venueName: string; venueId: string };

/** Authors see their working title; editors and reviewers the title as last sent. */
const sentTitle = sql<string>`coalesce((select ${rounds.sentTitle} from ${rounds} where ${rounds.submissionId} = ${submissions.id} and ${rounds.state} <> 'draft' order by ${rounds.number} desc limit 1), ${submissions.title})`;

const itemColumns = {
  id: submissions.id,
  title: submissions.title,
  stage: submissions.stage,
  venueName: venues.name,
  venueId: venues.id,
};

async function byMembership(db: Database, userId: string, role: "author" | "co-author" | "reviewer") {
  return db
    .select(role === "reviewer" ? { ...itemColumns, title: sentTitle } : itemColumns)
    .from(submissionMembers)
    .innerJoin(submissions, eq(submissions.id, submissionMembers.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(and(eq(submissionMembers.userId, userId), eq(submissionMembers.role, role)))
    .orderBy(desc(submissions.updatedAt));
}

/** One list per role the person holds; a role they do not hold is simply absent. */
export async function dashboardFor(db: Database, userId: string) {
  const editorVenues = await db
    .select({ id: venues.id, name: venues.name })
    .from(venueMembers)
    .innerJoin(venues, eq(venues.id, venueMembers.venueId))
    .where(and(eq(venueMembers.userId, userId), eq(venueMembers.role, "editor")));
  const venueIds = editorVenues.map((v) => v.id);
  const [authored, coAuthored, reviewing, editing] = await Promise.all([
    byMembership(db, userId, "author"),
    byMembership(db, userId, "co-author"),
    byMembership(db, userId, "reviewer"),
    venueIds.length
      ? db
          .select({ ...itemColumns, title: sentTitle })
          .from(submissions)
          .innerJoin(venues, eq(venues.id, submissions.venueId))
          .where(and(inArray(submissions.venueId, venueIds), inArray(submissions.stage, ["with-editor", "in-review"])))
          .orderBy(desc(submissions.updatedAt))
      : Promise.resolve([] as DashboardItem[]),
  ]);
  return { editorVenues, authored, coAuthored, reviewing, editing };
}
