import { absoluteUrl } from "~/mail/links.server";
import { href } from "react-router";
import { and, eq, inArray } from "drizzle-orm";
import type { Database } from "~db/client";
import { invitations, rounds, submissions } from "~db/schema";
import { env } from "~/config/env.server";
import { compose } from "~/mail/compose";
import { enqueueMail } from "~/mail/outbox.server";
import { audit } from "~/workspace/audit.server";
import { requestRecheck } from "~/workspace/recheck.server";
import { StateConflict } from "~/workspace/types";
import { roundContext, submissionAuthors } from "./round-context.server";
import { letterFor } from "./documents.server";
import { OPEN_STATES } from "./invitations.server";
import { releasedRemarks } from "./remarks.server";
import { releasedVerdicts } from "./verdicts.server";
import { openRevisionRound } from "./revision.server";
import { decisionLabel } from "./labels";
import { richMailPart } from "./tiptap/render.server";

type Decision = "accept" | "minor-revision" | "major-revision" | "reject";
const CONFLICT = "Another editor changed this decision while you were writing (or released it already). Reload the page to see the current state; your letter was not saved.";

/** Saves the decision and letter as a draft, guarded by the version the editor saw. */
export async function saveDecisionDraft(db: Database, opts: { roundId: string; decision: Decision; letter: unknown; expectedVersion: number }) {
  const [row] = await db
    .update(rounds)
    .set({ decision: opts.decision, letter: opts.letter, version: opts.expectedVersion + 1 })
    .where(and(eq(rounds.id, opts.roundId), eq(rounds.version, opts.expectedVersion), inArray(rounds.state, [...OPEN_STATES])))
    .returning();
  if (!row) throw new StateConflict(CONFLICT);
  return row;
}

/**
 * Decides and releases in one transaction: the round (only if still at the version the editor
 * saw — two editors releasing at once: exactly one wins), the audit entries, a revision round
 * when the decision asks for one, and the mail with the letter PDF to every author.
 */
export async function releaseDecision(db: Database, opts: { roundId: string; decision: Decision; letter: unknown; expectedVersion: number; editorId: string }) {
  const before = await roundContext(db, { roundId: opts.roundId });
  const result = await db.transaction(async (tx) => {
    const now = new Date();
    const [round] = await tx
      .update(rounds)
      .set({ state: "decided", decision: opts.decision, letter: opts.letter, decidedAt: now, decidedBy: opts.editorId, releasedAt: now, version: opts.expectedVersion + 1 })
      .where(and(eq(rounds.id, opts.roundId), eq(rounds.version, opts.expectedVersion), inArray(rounds.state, [...OPEN_STATES])))
      .returning();
    if (!round) throw new StateConflict(CONFLICT);
    const revision = opts.decision === "major-revision" || opts.decision === "minor-revision";
    await tx.update(submissions).set({ stage: revision ? "draft" : "decided", updatedAt: now }).where(eq(submissions.id, round.submissionId));
    // Invitations nobody answered are no longer needed once the round is decided.
    await tx.update(invitations).set({ state: "withdrawn" }).where(and(eq(invitations.roundId, round.id), eq(invitations.state, "pending")));
    await audit(tx, round.submissionId, opts.editorId, "decision.made", { round: round.number, decision: opts.decision });
    await audit(tx, round.submissionId, opts.editorId, "decision.released", { round: round.number });
    const next = revision ? await openRevisionRound(tx, round) : null;
    if (next) await audit(tx, round.submissionId, opts.editorId, "round.opened", { round: next.number });
    const ctx = { ...before, round };
    const pdf = await letterFor(tx, ctx);
    const remarks = await releasedRemarks(tx, round);
    // Disputes and questions on flags, as "Reviewer N" with their reasons (agreements need no mail).
    const asked = (await releasedVerdicts(tx, round)).flatMap((f) =>
      f.verdicts.filter((v) => v.reason).map((v) => `${v.reviewer} ${v.verdict === "dispute" ? "disputes" : "asks the authors about"} flag ${f.rule}${f.runLabel ? ` (run ${f.runLabel})` : ""}: ${v.reason}`),
    );
    const roundUrl = absoluteUrl(href("/venues/:venueId/submissions/:submissionId/rounds/:round/decision", { venueId: ctx.venue.id, submissionId: ctx.submission.id, round: String(round.number) }));
    for (const person of await submissionAuthors(tx, round.submissionId)) {
      await enqueueMail(
        tx,
        person.email,
        compose({
          subject: `Decision on round ${round.number}: ${ctx.submission.title}`,
          greeting: `Hello ${person.name},`,
          paragraphs: [
            `The editor of ${ctx.venue.name} decided on round ${round.number}: ${decisionLabel(opts.decision)}.`,
            richMailPart(opts.letter),
            ...remarks.flatMap((r) => [`${r.reviewer}, on ${r.anchor}:`, richMailPart(r.body)]),
            ...asked,
            ...(next ? [`Round ${next.number} is open for your revision, prefilled from round ${round.number}; answer each remark there.`] : []),
            "The decision letter with the remarks is attached as a PDF.",
          ],
          action: { label: "Read the decision", url: roundUrl },
        }),
        {
          dedupeKey: `decision:${round.id}:${person.email}`,
          attachments: [{ filename: `decision-round-${round.number}.pdf`, contentType: "application/pdf", contentBase64: Buffer.from(pdf).toString("base64") }],
        },
      );
    }
    return { round, next };
  });
  // The new round is checked by the worker (its runs and claims are copies; their checks are queued).
  if (result.next) await requestRecheck(db, result.next.id);
  return result;
}
