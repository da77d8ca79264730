import { and, eq, like } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { invitations, outbox, reviews, user } from "~db/schema";
import { sendReminders } from "~/jobs/reminders.server";
import { inviteReviewer, respondToInvitation } from "~/review/invitations.server";
import { makeSentRound } from "../../e2e/support/make-sent-round";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";
import { demoPeople } from "~db/demo-data";
import { newToken } from "~/review/link-tokens.server";

const { db, sql } = testDatabase();
const title = `Reminders ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

describe("reminder job", () => {
  it("sends one reminder however often it runs, and one overdue notice after the due date", async () => {
    const fx = await makeSentRound(db, title);
    const reviewerEmail = demoPeople.find((p) => p.key === "reviewer2")!.email;
    const [reviewer] = await db.select().from(user).where(eq(user.email, reviewerEmail));
    const [editor] = await db.select().from(user).where(eq(user.email, demoPeople.find((p) => p.key === "editor")!.email));
    const dueAt = new Date(Date.now() + 2 * 86_400_000);
    const inv = await inviteReviewer(db, { roundId: fx.roundId, email: reviewerEmail, dueAt, editorId: editor!.id });
    // The mail carries the token; here we set a known one so the test can answer.
    const { token, hash } = newToken();
    await db.update(invitations).set({ tokenHash: hash }).where(eq(invitations.id, inv.id));
    await respondToInvitation(db, { token, answer: "accept", userId: reviewer!.id });
    const [review] = await db.select().from(reviews).where(and(eq(reviews.roundId, fx.roundId), eq(reviews.reviewerId, reviewer!.id)));
    const mine = () => db.select().from(outbox).where(like(outbox.dedupeKey, `reminder:%:${review!.id}%`));

    await sendReminders(db);
    await sendReminders(db);
    const soon = await mine();
    expect(soon.filter((m) => m.toAddress === reviewerEmail)).toHaveLength(1);
    expect(soon[0]!.subject).toMatch(/Review due on/);

    const later = new Date(dueAt.getTime() + 3600_000);
    await sendReminders(db, later);
    await sendReminders(db, later);
    const all = (await mine()).filter((m) => m.toAddress === reviewerEmail);
    expect(all).toHaveLength(2);
    expect(all.filter((m) => m.subject.startsWith("Overdue review"))).toHaveLength(1);
  });
});
