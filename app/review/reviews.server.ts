import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, asc, eq, inArray, ne } from "drizzle-orm";
import type { Database } from "~db/client";
import { flags, flagVerdicts, remarks, reviews, rounds } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { audit } from "~/workspace/audit.server";
import { InvalidInput, StateConflict, type Db } from "~/workspace/types";
import { roundContext, venueEditors } from "./round-context.server";
import { recommendationLabel } from "./labels";
import { VERDICT_REASON_MAX, type RemarkInput } from "./review-forms";
import { isEmptyDoc } from "./tiptap/doc";

/** The signed-in reviewer's report on a round, or null when they hold none. */
export async function reviewOf(db: Db, roundId: string, reviewerId: string) {
  const [row] = await db.select().from(reviews).where(and(eq(reviews.roundId, roundId), eq(reviews.reviewerId, reviewerId)));
  return row ?? null;
}

/** A submitted report is locked: every write checks this first. */
function assertOpen(review: { state: string }) {
  if (review.state === "submitted") throw new StateConflict("This report was submitted and is locked.");
}

export async function setVerdict(db: Db, review: typeof reviews.$inferSelect, flagId: string, verdict: "agree" | "dispute" | "ask-authors", reason?: string | null) {
  assertOpen(review);
  const why = verdict === "agree" ? null : (reason?.trim() || null);
  if (verdict !== "agree" && !why) throw new InvalidInput("A dispute or a question needs a reason.", [{ path: "reason", message: "Say why, in a sentence or two; the authors will read it." }]);
  if (why && why.length > VERDICT_REASON_MAX) throw new InvalidInput("The reason is too long.", [{ path: "reason", message: `Keep the reason under ${VERDICT_REASON_MAX} characters.` }]);
  const [flag] = await db.select({ id: flags.id }).from(flags).where(and(eq(flags.id, flagId), eq(flags.roundId, review.roundId)));
  if (!flag) throw new InvalidInput("No such flag in this round.", [{ path: "flagId", message: "The flag is not part of the round under review." }]);
  await db
    .insert(flagVerdicts)
    .values({ reviewId: review.id, flagId, verdict, reason: why })
    .onConflictDoUpdate({ target: [flagVerdicts.reviewId, flagVerdicts.flagId], set: { verdict, reason: why, updatedAt: new Date() } });
  return { flagId, verdict, reason: why };
}

export async function saveRemark(db: Db, review: typeof reviews.$inferSelect, input: RemarkInput) {
  assertOpen(review);
  if (isEmptyDoc(input.body)) throw new InvalidInput("The remark is empty.", [{ path: "body", message: "Write the remark before saving it." }]);
  const anchorRef = input.anchorKind === "round" ? null : (input.anchorRef ?? null);
  if (input.anchorKind !== "round" && !anchorRef) throw new InvalidInput("The remark has no anchor.", [{ path: "anchorRef", message: "Choose the claim, run or flag the remark is about." }]);
  if (input.remarkId) {
    const [row] = await db
      .update(remarks)
      .set({ body: input.body, anchorKind: input.anchorKind, anchorRef, updatedAt: new Date() })
      .where(and(eq(remarks.id, input.remarkId), eq(remarks.reviewId, review.id)))
      .returning();
    if (!row) throw new InvalidInput("No such remark in your report.", [{ path: "remarkId", message: "The remark was deleted or is not yours." }]);
    return row;
  }
  const [row] = await db.insert(remarks).values({ reviewId: review.id, anchorKind: input.anchorKind, anchorRef, body: input.body }).returning();
  return row!;
}

export async function deleteRemark(db: Db, review: typeof reviews.$inferSelect, remarkId: string) {
  assertOpen(review);
  await db.delete(remarks).where(and(eq(remarks.id, remarkId), eq(remarks.reviewId, review.id)));
}

export async function saveReportMeta(db: Db, review: typeof reviews.$inferSelect, input: { recommendation?: string | null; editorNote?: unknown }) {
  assertOpen(review);
  await db
    .update(reviews)
    .set({ recommendation: (input.recommendation || null) as never, editorNote: input.editorNote ?? null })
    .where(eq(reviews.id, review.id));
}

export async function reportParts(db: Db, reviewId: string) {
  const [verdicts, remarkRows] = await Promise.all([
    db.select({ flagId: flagVerdicts.flagId, verdict: flagVerdicts.verdict, reason: flagVerdicts.reason }).from(flagVerdicts).where(eq(flagVerdicts.reviewId, reviewId)),
    db.select().from(remarks).where(eq(remarks.reviewId, reviewId)).orderBy(asc(remarks.createdAt)),
  ]);
  return { verdicts, remarks: remarkRows };
}

/** The verdicts and remarks of several reports at once (two statements however many reports). */
export async function reportPartsOf(db: Db, reviewIds: string[]) {
  const out = new Map<string, Awaited<ReturnType<typeof reportParts>>>(reviewIds.map((id) => [id, { verdicts: [], remarks: [] }]));
  if (!reviewIds.length) return out;
  const [verdicts, remarkRows] = await Promise.all([
    db.select({ reviewId: flagVerdicts.reviewId, flagId: flagVerdicts.flagId, verdict: flagVerdicts.verdict, reason: flagVerdicts.reason }).from(flagVerdicts).where(inArray(flagVerdicts.reviewId, reviewIds)),
    db.select().from(remarks).where(inArray(remarks.reviewId, reviewIds)).orderBy(asc(remarks.createdAt)),
  ]);
  for (const { reviewId, ...v } of verdicts) out.get(reviewId)?.verdicts.push(v);
  for (const m of remarkRows) out.get(m.reviewId)?.remarks.push(m);
  return out;
}

/** Submits and locks the report; when it is the last open one, the round's reviews are in. */
export async function submitReview(db: Database, review: typeof reviews.$inferSelect, userId: string) {
  assertOpen(review);
  if (!review.recommendation) throw new InvalidInput("Choose a recommendation before submitting.", [{ path: "recommendation", message: "Accept, minor revision, major revision or reject." }]);
  const ctx = await roundContext(db, { roundId: review.roundId });
  return db.transaction(async (tx) => {
    const [done] = await tx
      .update(reviews)
      .set({ state: "submitted", submittedAt: new Date() })
      .where(and(eq(reviews.id, review.id), eq(reviews.state, "in-progress")))
      .returning();
    if (!done) throw new StateConflict("This report was already submitted.");
    const open = await tx.select({ id: reviews.id }).from(reviews).where(and(eq(reviews.roundId, review.roundId), ne(reviews.state, "submitted")));
    if (open.length === 0) await tx.update(rounds).set({ state: "reviews-in" }).where(and(eq(rounds.id, review.roundId), eq(rounds.state, "under-review")));
    await audit(tx, ctx.submission.id, userId, "review.submitted", { round: ctx.round.number, reviewer: `Reviewer ${review.number}` });
    for (const editor of await venueEditors(tx, ctx.venue.id)) {
      await enqueueMail(
        tx,
        editor.email,
        compose({
          subject: `Review submitted: ${ctx.submission.title}`,
          greeting: `Hello ${editor.name},`,
          paragraphs: [`Reviewer ${review.number} submitted a report on round ${ctx.round.number} of "${ctx.submission.title}" (recommendation: ${recommendationLabel(review.recommendation).toLowerCase()}).`],
          action: { label: "Read the reports", url: absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", { venueId: ctx.venue.id, submissionId: ctx.submission.id, round: String(ctx.round.number) })) },
        }),
        { dedupeKey: `review-submitted:${review.id}:${editor.email}` },
      );
    }
    return done;
  });
}
