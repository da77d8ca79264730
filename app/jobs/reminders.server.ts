import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, gt, isNotNull, lte, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, reviews, rounds, submissions, user, venues } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { venueEditors } from "~/review/round-context.server";

const SOON_MS = 3 * 86_400_000;

/**
 * Reminds reviewers of open reports: once when the due date is within three days, once when it
 * has passed (the editor is told too). Idempotent through the outbox's dedupe key, so however
 * often the job runs, each reminder is sent once.
 */
export async function sendReminders(db: Database, now = new Date()) {
  // Links nobody used before they expired: the desk shows them as expired, not pending.
  await db.update(invitations).set({ state: "expired" }).where(and(eq(invitations.state, "pending"), lte(invitations.tokenExpiresAt, now)));
  const open = await db
    .select({ id: reviews.id, number: reviews.number, dueAt: reviews.dueAt, email: user.email, name: user.name, roundNumber: rounds.number, submissionId: submissions.id, title: sql<string>`coalesce(${rounds.sentTitle}, ${submissions.title})`, venueId: venues.id, venueName: venues.name })
    .from(reviews)
    .innerJoin(user, eq(user.id, reviews.reviewerId))
    .innerJoin(rounds, eq(rounds.id, reviews.roundId))
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(and(eq(reviews.state, "in-progress"), isNotNull(reviews.dueAt), lte(reviews.dueAt, new Date(now.getTime() + SOON_MS)), gt(reviews.dueAt, new Date(0))));
  let queued = 0;
  for (const r of open) {
    const overdue = r.dueAt!.getTime() <= now.getTime();
    const due = r.dueAt!.toISOString().slice(0, 10);
    const url = absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.roundNumber) }));
    const kind = overdue ? "overdue" : "soon";
    const sent = await enqueueMail(
      db,
      r.email,
      compose({
        subject: overdue ? `Overdue review: ${r.title}` : `Review due on ${due}: ${r.title}`,
        greeting: `Hello ${r.name},`,
        paragraphs: [overdue ? `Your review of round ${r.roundNumber} of "${r.title}" for ${r.venueName} was due on ${due}.` : `Your review of round ${r.roundNumber} of "${r.title}" for ${r.venueName} is due on ${due}.`],
        action: { label: "Open your review", url },
      }),
      { dedupeKey: `reminder:${kind}:${r.id}` },
    );
    if (sent) queued++;
    if (overdue) {
      for (const editor of await venueEditors(db, r.venueId)) {
        await enqueueMail(
          db,
          editor.email,
          compose({
            subject: `Overdue: Reviewer ${r.number} on ${r.title}`,
            greeting: `Hello ${editor.name},`,
            paragraphs: [`Reviewer ${r.number}'s report on round ${r.roundNumber} was due on ${due} and is not submitted yet.`],
            action: { label: "Open the round", url: absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", { venueId: r.venueId, submissionId: r.submissionId, round: String(r.roundNumber) })) },
          }),
          { dedupeKey: `reminder:overdue-editor:${r.id}:${editor.email}` },
        );
      }
    }
  }
  return { queued };
}
