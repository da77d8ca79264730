/**
 * Test fixture: a fresh submission of the demo author at the demo venue with an empty draft
 * round 1, for tests that add runs themselves; `removeSubmission` deletes it again.
 */
import { eq } from "drizzle-orm";
import type { Database } from "../../database/client";
import { demoPeople, demoVenue } from "../../database/demo-data";
import { rounds, submissionMembers, submissions, user, venues } from "../../database/schema";

export async function makeDraftRound(db: Database, title: string) {
  const [venue] = await db.select().from(venues).where(eq(venues.slug, demoVenue.slug));
  if (!venue) throw new Error("the demo venue is missing: seed the test database first (npm run db:seed)");
  const email = demoPeople.find((d) => d.key === "author")!.email;
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return db.transaction(async (tx) => {
    const [sub] = await tx.insert(submissions).values({ venueId: venue.id, title, createdBy: author!.id }).returning();
    await tx.insert(submissionMembers).values({ submissionId: sub!.id, userId: author!.id, role: "author", corresponding: true });
    await tx.insert(rounds).values({ submissionId: sub!.id, number: 1 });
    return { venueId: venue.id, submissionId: sub!.id };
  });
}

export async function removeSubmission(db: Database, submissionId: string) {
  await db.delete(submissions).where(eq(submissions.id, submissionId));
}
