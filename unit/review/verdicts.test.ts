import { and, eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { demoPeople } from "~db/demo-data";
import { flagVerdicts, flags, outbox, reviews, rounds, user } from "~db/schema";
import { releaseDecision } from "~/review/decisions.server";
import { submitReview, setVerdict, saveReportMeta } from "~/review/reviews.server";
import { releasedVerdicts, saveVerdictAnswer, submittedVerdictsByFlag } from "~/review/verdicts.server";
import { InvalidInput, StateConflict } from "~/workspace/types";
import { makeReviewOpen } from "../../e2e/support/make-review-open";
import { testDatabase } from "../support/test-db";
import { dropQueuedMail } from "./outbox-cleanup";

const { db, sql } = testDatabase();
const title = `Verdicts reach the authors ${Date.now()}`;
afterAll(async () => {
  await dropQueuedMail(db, title);
  await sql.end({ timeout: 5 });
});

const idOf = async (key: string) => (await db.select({ id: user.id }).from(user).where(eq(user.email, demoPeople.find((p) => p.key === key)!.email)))[0]!.id;

describe("verdicts with reasons, released to the authors as Reviewer N, answered in the next round", () => {
  it("stores a reason, hides drafts, releases without identities and takes one answer per verdict", async () => {
    const fx = await makeReviewOpen(db, title);
    const reviewerId = await idOf("reviewer1");
    const [review] = await db.select().from(reviews).where(and(eq(reviews.roundId, fx.roundId), eq(reviews.reviewerId, reviewerId)));
    const [a, b] = await db.select({ id: flags.id }).from(flags).where(eq(flags.roundId, fx.roundId)).limit(2);

    // A dispute needs its reason; nothing is stored when it is missing.
    await expect(setVerdict(db, review!, a!.id, "dispute", "  ")).rejects.toBeInstanceOf(InvalidInput);
    expect(await db.select().from(flagVerdicts).where(eq(flagVerdicts.reviewId, review!.id))).toHaveLength(0);
    await setVerdict(db, review!, a!.id, "dispute", "The unit of η is off by 10^3.");
    await setVerdict(db, review!, b!.id, "agree", "ignored for agreement");
    const stored = await db.select().from(flagVerdicts).where(eq(flagVerdicts.reviewId, review!.id));
    expect(Object.fromEntries(stored.map((v) => [v.flagId, v.reason]))).toEqual({ [a!.id]: "The unit of η is off by 10^3.", [b!.id]: null });

    // A draft report's verdicts reach nobody.
    expect(await submittedVerdictsByFlag(db, fx.roundId)).toEqual({});
    await saveReportMeta(db, review!, { recommendation: "major-revision" });
    const [fresh] = await db.select().from(reviews).where(eq(reviews.id, review!.id));
    await submitReview(db, fresh!, reviewerId);
    expect((await submittedVerdictsByFlag(db, fx.roundId))[a!.id]).toEqual([{ number: 1, verdict: "dispute", reason: "The unit of η is off by 10^3." }]);

    // Before release the authors see nothing; after, "Reviewer 1" and no id or name.
    const [before] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    expect(await releasedVerdicts(db, before!)).toEqual([]);
    await releaseDecision(db, { roundId: fx.roundId, decision: "major-revision", letter: { type: "doc", content: [] }, expectedVersion: before!.version, editorId: await idOf("editor") });
    const [after] = await db.select().from(rounds).where(eq(rounds.id, fx.roundId));
    const released = await releasedVerdicts(db, after!);
    const text = JSON.stringify(released);
    expect(text).toContain("Reviewer 1");
    for (const secret of [reviewerId, review!.id, demoPeople.find((p) => p.key === "reviewer1")!.name, demoPeople.find((p) => p.key === "reviewer1")!.email]) expect(text).not.toContain(secret);
    // The decision mail carries the dispute with its reason, signed "Reviewer 1" only.
    const [mail] = await db.select().from(outbox).where(eq(outbox.dedupeKey, `decision:${fx.roundId}:${demoPeople.find((p) => p.key === "author")!.email}`));
    expect(mail!.textBody).toContain("Reviewer 1 disputes flag");
    expect(mail!.textBody).toContain("The unit of η is off by 10^3.");
    expect(mail!.textBody).not.toContain(demoPeople.find((p) => p.key === "reviewer1")!.name);
    expect(released.find((f) => f.flagId === a!.id)!.verdicts).toEqual([{ reviewer: "Reviewer 1", number: 1, verdict: "dispute", reason: "The unit of η is off by 10^3.", answer: null }]);

    // The authors answer the dispute while round 2 is their draft; an agreement takes no answer.
    const authorId = await idOf("author");
    await saveVerdictAnswer(db, { submissionId: fx.submissionId, decidedRound: 1, flagId: a!.id, reviewer: 1, answer: "Corrected in round 2.", authorId });
    await expect(saveVerdictAnswer(db, { submissionId: fx.submissionId, decidedRound: 1, flagId: b!.id, reviewer: 1, answer: "Thanks.", authorId })).rejects.toBeInstanceOf(InvalidInput);
    await expect(saveVerdictAnswer(db, { submissionId: fx.submissionId, decidedRound: 1, flagId: a!.id, reviewer: 2, answer: "Nobody.", authorId })).rejects.toBeInstanceOf(InvalidInput);
    expect((await releasedVerdicts(db, after!)).find((f) => f.flagId === a!.id)!.verdicts[0]!.answer).toBe("Corrected in round 2.");

    // Once round 2 is sent, the answers are frozen.
    await db.update(rounds).set({ state: "sent" }).where(and(eq(rounds.submissionId, fx.submissionId), eq(rounds.number, 2)));
    await expect(saveVerdictAnswer(db, { submissionId: fx.submissionId, decidedRound: 1, flagId: a!.id, reviewer: 1, answer: "Too late.", authorId })).rejects.toBeInstanceOf(StateConflict);
  });
});
