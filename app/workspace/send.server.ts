import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, asc, eq, inArray, isNull, ne } from "drizzle-orm";
import type { Database } from "~db/client";
import { contributors, flags, rounds, submissionMembers, submissions, user, venueMembers, venues } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { audit } from "./audit.server";
import { StateConflict } from "./types";

/** Mismatch flags that still have neither a fix nor an answer block sending. */
export async function unansweredMismatches(db: Database, roundId: string) {
  return db
    .select({ id: flags.id, rule: flags.rule, runLabel: flags.runLabel, message: flags.message })
    .from(flags)
    .where(and(eq(flags.roundId, roundId), eq(flags.severity, "mismatch"), isNull(flags.authorAnswer)));
}

/**
 * Sends a draft round to the editor: checks the mismatches, freezes the round (its run
 * versions are already pinned in round_runs; its state leaves draft), records it, and queues
 * the editors' mail — all in one transaction, guarded by the round's version.
 */
export async function sendRound(db: Database, opts: { roundId: string; userId: string; expectedVersion: number }) {
  const [state] = await db.select({ checkError: rounds.checkError }).from(rounds).where(eq(rounds.id, opts.roundId));
  if (state?.checkError) {
    throw new StateConflict(`The last check of this round failed (${state.checkError}), so its flags are out of date; fix the problem so the round can be checked, then send it.`);
  }
  const blocking = await unansweredMismatches(db, opts.roundId);
  if (blocking.length) {
    throw new StateConflict(
      `${blocking.length} mismatch flag(s) are neither fixed nor answered; answer each one with an explanation or fix the run or claim first.`,
    );
  }
  return db.transaction(async (tx) => {
    const [round] = await tx
      .update(rounds)
      .set({ state: "sent", sentAt: new Date(), sentBy: opts.userId, version: opts.expectedVersion + 1 })
      .where(and(eq(rounds.id, opts.roundId), eq(rounds.state, "draft"), eq(rounds.version, opts.expectedVersion)))
      .returning();
    if (!round) throw new StateConflict("This round was already sent or changed by someone else: reload the page.");
    await freezeManuscript(tx, round.id, round.submissionId);
    const [sub] = await tx
      .update(submissions)
      .set({ stage: "with-editor", updatedAt: new Date() })
      .where(eq(submissions.id, round.submissionId))
      .returning({ id: submissions.id, title: submissions.title, venueId: submissions.venueId });
    await audit(tx, sub!.id, opts.userId, "round.sent", { round: round.number });
    const editors = await tx
      .select({ email: user.email, name: user.name, venueName: venues.name })
      .from(venueMembers)
      .innerJoin(user, eq(user.id, venueMembers.userId))
      .innerJoin(venues, eq(venues.id, venueMembers.venueId))
      .where(and(eq(venueMembers.venueId, sub!.venueId), eq(venueMembers.role, "editor")));
    for (const editor of editors) {
      await enqueueMail(
        tx,
        editor.email,
        compose({
          subject: `Round ${round.number} sent: ${sub!.title}`,
          greeting: `Hello ${editor.name},`,
          paragraphs: [
            `The authors sent round ${round.number} of "${sub!.title}" to ${editor.venueName}.`,
            "The checker's flags and the authors' answers to them are on the round's page.",
          ],
          action: { label: "Open the editor's desk", url: absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", { venueId: sub!.venueId, submissionId: sub!.id, round: String(round.number) })) },
        }),
        { dedupeKey: `round-sent:${round.id}:${editor.email}` },
      );
    }
    // The other authors learn that the round left their hands (and is now frozen).
    const authors = await tx
      .selectDistinct({ email: user.email, name: user.name })
      .from(submissionMembers)
      .innerJoin(user, eq(user.id, submissionMembers.userId))
      .where(and(eq(submissionMembers.submissionId, sub!.id), inArray(submissionMembers.role, ["author", "co-author"]), ne(submissionMembers.userId, opts.userId)));
    for (const a of authors) {
      await enqueueMail(
        tx,
        a.email,
        compose({
          subject: `Round ${round.number} sent to the editor: ${sub!.title}`,
          greeting: `Hello ${a.name},`,
          paragraphs: [
            `Round ${round.number} of "${sub!.title}" was sent to the editor; its runs and claims are now frozen.`,
            "You will hear when the editor decides; changes go into the next round.",
          ],
          action: { label: "Open the round", url: absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round", { venueId: sub!.venueId, submissionId: sub!.id, round: String(round.number) })) },
        }),
        { dedupeKey: `round-sent-author:${round.id}:${a.email}` },
      );
    }
    return round;
  });
}

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** Copies the manuscript as it is now into the round: what everyone but the authors will read. */
async function freezeManuscript(tx: Tx, roundId: string, submissionId: string) {
  const [sub] = await tx
    .select({ title: submissions.title, abstract: submissions.abstract, keywords: submissions.keywords, file: submissions.manuscriptFileId })
    .from(submissions)
    .where(eq(submissions.id, submissionId));
  const people = await tx
    .select({
      position: contributors.position,
      name: contributors.name,
      affiliation: contributors.affiliation,
      orcid: contributors.orcid,
      creditRoles: contributors.creditRoles,
      corresponding: contributors.corresponding,
    })
    .from(contributors)
    .where(eq(contributors.submissionId, submissionId))
    .orderBy(asc(contributors.position));
  await tx
    .update(rounds)
    .set({ sentTitle: sub!.title, sentAbstract: sub!.abstract, sentKeywords: sub!.keywords, sentManuscriptFileId: sub!.file, sentContributors: people })
    .where(eq(rounds.id, roundId));
}
