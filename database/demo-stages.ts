/**
 * The demo's submissions at every stage of the review cycle, made through the domain services
 * (createSubmission, sendRound, inviteReviewer, respondToInvitation, the report services,
 * releaseDecision, saveRemarkResponse), so the data is what the app itself would have stored.
 * Runs inside the seed's one transaction; each submission is found by title and left alone.
 */
import { and, eq, isNull } from "drizzle-orm";
import type { Env } from "../app/config/env-schema";
import { releaseDecision } from "../app/review/decisions.server";
import { inviteReviewer, respondToInvitation } from "../app/review/invitations.server";
import { saveRemark, saveReportMeta, setVerdict, submitReview } from "../app/review/reviews.server";
import { saveRemarkResponse } from "../app/review/revision.server";
import { newToken } from "../app/review/link-tokens.server";
import { sendRound } from "../app/workspace/send.server";
import { createSubmission } from "../app/workspace/submissions.server";
import type { Database } from "./client";
import { demoLetters, demoPeople, demoRemarks, demoStages, type DemoKey } from "./demo-data";
import { contributors, flags, invitations, remarks, reviews, rounds, submissionMembers, submissions } from "./schema";
import { seedDemoRound } from "./seed-round";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
type Ids = Record<DemoKey, string>;
type Stage = keyof typeof demoStages;

const DAY = 86_400_000;
const person = (key: DemoKey) => demoPeople.find((p) => p.key === key)!;

/** A submission with its authors listed and round 1 filled with the demo runs, or null if it exists already. */
async function newStageSubmission(tx: Tx, env: Env, ids: Ids, opts: { stage: Stage; venueId: string; author: DemoKey; coauthors: DemoKey[] }) {
  const { title, abstract } = demoStages[opts.stage];
  const [found] = await tx.select({ id: submissions.id }).from(submissions).where(and(eq(submissions.venueId, opts.venueId), eq(submissions.title, title)));
  if (found) return null;
  const db = tx as unknown as Database;
  const { submissionId } = await createSubmission(db, { venueId: opts.venueId, userId: ids[opts.author], fields: { title, abstract, keywords: ["stable layer", "Veyra"], availability: "Run records and series are attached to each run.", dois: [] } });
  for (const [i, key] of opts.coauthors.entries()) {
    const p = person(key);
    await tx.insert(submissionMembers).values({ submissionId, userId: ids[key], role: "co-author" });
    await tx.insert(contributors).values({ submissionId, userId: ids[key], position: i + 2, name: p.name, email: p.email, affiliation: p.affiliation });
  }
  const { roundId } = await seedDemoRound(tx, env, { submissionId, authorId: ids[opts.author] });
  return { submissionId, roundId };
}

/** The authors answer every mismatch (the answer is what reviewers read), then send the round. */
async function answerAndSend(tx: Tx, roundId: string, authorId: string) {
  await tx
    .update(flags)
    .set({ authorAnswer: "We keep this value on purpose and explain why in the methods section.", answeredBy: authorId })
    .where(and(eq(flags.roundId, roundId), eq(flags.severity, "mismatch"), isNull(flags.authorAnswer)));
  const [draft] = await tx.select({ version: rounds.version }).from(rounds).where(eq(rounds.id, roundId));
  await sendRound(tx as unknown as Database, { roundId, userId: authorId, expectedVersion: draft!.version });
}

/** Invites and accepts in the reviewer's name; the mailed token is unknown here, so the invitation gets one we know. */
async function acceptedReview(tx: Tx, ids: Ids, roundId: string, reviewer: DemoKey, editor: DemoKey) {
  const db = tx as unknown as Database;
  const inv = await inviteReviewer(db, { roundId, email: person(reviewer).email, dueAt: new Date(Date.now() + 21 * DAY), editorId: ids[editor] });
  const { token, hash } = newToken();
  await tx.update(invitations).set({ tokenHash: hash }).where(eq(invitations.id, inv.id));
  await respondToInvitation(db, { token, answer: "accept", userId: ids[reviewer] });
  const [review] = await tx.select().from(reviews).where(and(eq(reviews.roundId, roundId), eq(reviews.reviewerId, ids[reviewer])));
  return review!;
}

/** A report with verdicts, a remark with a formula on the round and one on a flag. */
async function writeReport(tx: Tx, ids: Ids, roundId: string, reviewer: DemoKey, opts: { recommendation: string; submit: boolean }, editor: DemoKey = "editor") {
  const review = await acceptedReview(tx, ids, roundId, reviewer, editor);
  const flagRows = await tx.select({ id: flags.id, severity: flags.severity }).from(flags).where(eq(flags.roundId, roundId));
  const mismatch = flagRows.find((f) => f.severity === "mismatch");
  const caution = flagRows.find((f) => f.severity === "caution");
  if (mismatch) await setVerdict(tx, review, mismatch.id, "agree");
  if (caution) await setVerdict(tx, review, caution.id, "ask-authors", "How long was the transient you left out of the averages?");
  await saveRemark(tx, review, { anchorKind: "round", body: demoRemarks.round });
  if (mismatch) await saveRemark(tx, review, { anchorKind: "flag", anchorRef: mismatch.id, body: demoRemarks.flag });
  await saveReportMeta(tx, review, { recommendation: opts.recommendation, editorNote: demoRemarks.note });
  if (opts.submit) {
    const [fresh] = await tx.select().from(reviews).where(eq(reviews.id, review.id));
    await submitReview(tx as unknown as Database, fresh!, ids[reviewer]);
  }
  return review;
}

async function decide(tx: Tx, ids: Ids, roundId: string, decision: "accept" | "major-revision", letter: unknown) {
  const [round] = await tx.select({ version: rounds.version }).from(rounds).where(eq(rounds.id, roundId));
  return releaseDecision(tx as unknown as Database, { roundId, decision, letter, expectedVersion: round!.version, editorId: ids.editor });
}

/** Seeds every stage that is missing; returns the titles it created. */
export async function seedDemoStages(tx: Tx, env: Env, ids: Ids, venues: { main: string; blind: string }) {
  const created: string[] = [];
  const common = { venueId: venues.main, author: "author" as const, coauthors: ["coauthor1", "coauthor2"] as DemoKey[] };

  // Sent, awaiting reviewers: the editor's desk shows it under "New" with nobody invited yet.
  const sent = await newStageSubmission(tx, env, ids, { ...common, stage: "sent" });
  if (sent) {
    await answerAndSend(tx, sent.roundId, ids.author);
    created.push(demoStages.sent.title);
  }

  // Under review: Reviewer 1 has reported; Reviewer 2 accepted and is still writing.
  const review = await newStageSubmission(tx, env, ids, { ...common, stage: "underReview" });
  if (review) {
    await answerAndSend(tx, review.roundId, ids.author);
    await writeReport(tx, ids, review.roundId, "reviewer1", { recommendation: "minor-revision", submit: true });
    await acceptedReview(tx, ids, review.roundId, "reviewer2", "editor");
    created.push(demoStages.underReview.title);
  }

  // Decided with a major revision; round 2 is open and the authors have answered one remark.
  const major = await newStageSubmission(tx, env, ids, { ...common, stage: "majorRevision" });
  if (major) {
    await answerAndSend(tx, major.roundId, ids.author);
    await writeReport(tx, ids, major.roundId, "reviewer1", { recommendation: "major-revision", submit: true });
    await writeReport(tx, ids, major.roundId, "reviewer2", { recommendation: "minor-revision", submit: true });
    await decide(tx, ids, major.roundId, "major-revision", demoLetters.majorRevision);
    const [first] = await tx
      .select({ id: remarks.id })
      .from(remarks)
      .innerJoin(reviews, eq(reviews.id, remarks.reviewId))
      .where(and(eq(reviews.roundId, major.roundId), eq(remarks.anchorKind, "round")))
      .limit(1);
    if (first) await saveRemarkResponse(tx, { submissionId: major.submissionId, remarkId: first.id, response: "strat-C now runs for 1.6 magnetic diffusion times; see the new Fig. 5.", authorId: ids.author });
    created.push(demoStages.majorRevision.title);
  }

  // Accepted after one round.
  const accepted = await newStageSubmission(tx, env, ids, { ...common, stage: "accepted" });
  if (accepted) {
    await answerAndSend(tx, accepted.roundId, ids.author);
    await writeReport(tx, ids, accepted.roundId, "reviewer2", { recommendation: "accept", submit: true });
    await decide(tx, ids, accepted.roundId, "accept", demoLetters.accepted);
    created.push(demoStages.accepted.title);
  }

  // The double-blind venue: its own editor; Reviewer 1 is writing a report and never sees who the authors are.
  const blind = await newStageSubmission(tx, env, ids, { venueId: venues.blind, author: "coauthor1", coauthors: [], stage: "blind" });
  if (blind) {
    await answerAndSend(tx, blind.roundId, ids.coauthor1);
    await acceptedReview(tx, ids, blind.roundId, "reviewer1", "editor2");
    created.push(demoStages.blind.title);
  }
  return created;
}
