import { and, asc, eq } from "drizzle-orm";
import { flagVerdicts, flags, reviews, rounds } from "~db/schema";
import { InvalidInput, StateConflict, type Db } from "~/workspace/types";

/**
 * The reviewers' verdicts on a released round's flags, as authors may read them: each reviewer is
 * "Reviewer N"; reviewer ids, names and report ids are never selected. Only submitted reports
 * count (a draft was never part of the decision). Empty until the decision is released.
 */
export async function releasedVerdicts(db: Db, round: { id: string; releasedAt: Date | null }) {
  if (!round.releasedAt) return [];
  const rows = await db
    .select({
      flagId: flags.id,
      rule: flags.rule,
      severity: flags.severity,
      runLabel: flags.runLabel,
      message: flags.message,
      number: reviews.number,
      verdict: flagVerdicts.verdict,
      reason: flagVerdicts.reason,
      answer: flagVerdicts.answer,
    })
    .from(flagVerdicts)
    .innerJoin(reviews, eq(reviews.id, flagVerdicts.reviewId))
    .innerJoin(flags, eq(flags.id, flagVerdicts.flagId))
    .where(and(eq(reviews.roundId, round.id), eq(reviews.state, "submitted")))
    .orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel), asc(flags.id), asc(reviews.number));
  // One entry per flag, its verdicts in reviewer order.
  const byFlag = new Map<string, { flagId: string; rule: string; severity: string; runLabel: string | null; message: string; verdicts: { reviewer: string; number: number; verdict: string; reason: string | null; answer: string | null }[] }>();
  for (const r of rows) {
    let entry = byFlag.get(r.flagId);
    if (!entry) byFlag.set(r.flagId, (entry = { flagId: r.flagId, rule: r.rule, severity: r.severity, runLabel: r.runLabel, message: r.message, verdicts: [] }));
    entry.verdicts.push({ reviewer: `Reviewer ${r.number}`, number: r.number, verdict: r.verdict, reason: r.reason, answer: r.answer });
  }
  return [...byFlag.values()];
}

/** Verdicts that ask something of the authors and so take an answer. */
export const ANSWERABLE = new Set(["dispute", "ask-authors"]);

/**
 * The authors answer Reviewer N's dispute or question on a flag of released round `decided`,
 * while round `decided + 1` is their draft; once that round is sent the answers are frozen.
 */
export async function saveVerdictAnswer(db: Db, opts: { submissionId: string; decidedRound: number; flagId: string; reviewer: number; answer: string; authorId: string }) {
  const [round] = await db
    .select({ id: rounds.id, releasedAt: rounds.releasedAt })
    .from(rounds)
    .where(and(eq(rounds.submissionId, opts.submissionId), eq(rounds.number, opts.decidedRound)));
  if (!round?.releasedAt) throw new StateConflict("The decision on this round has not been released.");
  const [next] = await db
    .select({ state: rounds.state })
    .from(rounds)
    .where(and(eq(rounds.submissionId, opts.submissionId), eq(rounds.number, opts.decidedRound + 1)));
  if (!next) throw new StateConflict("No revision round is open for this decision.");
  if (next.state !== "draft") throw new StateConflict(`Round ${opts.decidedRound + 1} was sent; its answers are frozen.`);
  const [review] = await db
    .select({ id: reviews.id })
    .from(reviews)
    .where(and(eq(reviews.roundId, round.id), eq(reviews.number, opts.reviewer), eq(reviews.state, "submitted")));
  const [verdict] = review
    ? await db
        .select({ verdict: flagVerdicts.verdict })
        .from(flagVerdicts)
        .innerJoin(flags, eq(flags.id, flagVerdicts.flagId))
        .where(and(eq(flagVerdicts.reviewId, review.id), eq(flagVerdicts.flagId, opts.flagId), eq(flags.roundId, round.id)))
    : [];
  if (!verdict) throw new InvalidInput("No such verdict.", [{ path: "flagId", message: `Reviewer ${opts.reviewer} left no verdict on this flag.` }]);
  if (!ANSWERABLE.has(verdict.verdict)) throw new InvalidInput("This verdict needs no answer.", [{ path: "answer", message: "The reviewer agreed with the flag; there is nothing to answer." }]);
  await db
    .update(flagVerdicts)
    .set({ answer: opts.answer, answeredBy: opts.authorId, answeredAt: new Date() })
    .where(and(eq(flagVerdicts.reviewId, review!.id), eq(flagVerdicts.flagId, opts.flagId)));
}

/**
 * Every submitted verdict of a round, per flag, for the editor (who may see who said what):
 * `{ flagId: [{ number, verdict, reason }] }`. Drafts stay private to their reviewer.
 */
export async function submittedVerdictsByFlag(db: Db, roundId: string) {
  const rows = await db
    .select({ flagId: flagVerdicts.flagId, number: reviews.number, verdict: flagVerdicts.verdict, reason: flagVerdicts.reason })
    .from(flagVerdicts)
    .innerJoin(reviews, eq(reviews.id, flagVerdicts.reviewId))
    .where(and(eq(reviews.roundId, roundId), eq(reviews.state, "submitted")))
    .orderBy(asc(reviews.number));
  const out: Record<string, { number: number; verdict: string; reason: string | null }[]> = {};
  for (const r of rows) (out[r.flagId] ??= []).push({ number: r.number, verdict: r.verdict, reason: r.reason });
  return out;
}
