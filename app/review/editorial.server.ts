import { and, asc, desc, eq } from "drizzle-orm";
import { auditLog, flags, invitations, reviews, roundRuns, rounds, runs, user } from "~db/schema";
import type { RoundContext } from "./round-context.server";
import { anchorLabels } from "./remarks.server";
import { reportPartsOf } from "./reviews.server";
import { renderRichText } from "./tiptap/render.server";
import { submittedVerdictsByFlag } from "./verdicts.server";
import type { Database } from "~db/client";

/** What the editor's round page shows: invitations, full reports (with editor-only notes), audit. */
export async function editorialView(db: Database, ctx: RoundContext, opts: { showReviewerNames: boolean } = { showReviewerNames: false }) {
  const [invites, reviewRows, audit, flagRows, previous, verdictRows, runLinks] = await Promise.all([
    db.select({ id: invitations.id, email: invitations.email, state: invitations.state, dueAt: invitations.dueAt, createdAt: invitations.createdAt }).from(invitations).where(eq(invitations.roundId, ctx.round.id)).orderBy(asc(invitations.createdAt)),
    db
      .select({ id: reviews.id, number: reviews.number, state: reviews.state, recommendation: reviews.recommendation, editorNote: reviews.editorNote, dueAt: reviews.dueAt, submittedAt: reviews.submittedAt, name: user.name, email: user.email })
      .from(reviews)
      .innerJoin(user, eq(user.id, reviews.reviewerId))
      .where(eq(reviews.roundId, ctx.round.id))
      .orderBy(asc(reviews.number)),
    db.select({ id: auditLog.id, action: auditLog.action, detail: auditLog.detail, at: auditLog.at, actor: user.name }).from(auditLog).leftJoin(user, eq(user.id, auditLog.actorId)).where(eq(auditLog.submissionId, ctx.submission.id)).orderBy(desc(auditLog.at)),
    // What the page says of the flags (counts, names in the reports); the table reads the flags after the page.
    db.select({ id: flags.id, rule: flags.rule, runLabel: flags.runLabel, severity: flags.severity }).from(flags).where(eq(flags.roundId, ctx.round.id)),
    ctx.round.number > 1 ? db.select({ id: rounds.id }).from(rounds).where(and(eq(rounds.submissionId, ctx.submission.id), eq(rounds.number, ctx.round.number - 1))) : Promise.resolve([]),
    submittedVerdictsByFlag(db, ctx.round.id),
    db.select({ runId: runs.id, label: runs.label }).from(roundRuns).innerJoin(runs, eq(runs.id, roundRuns.runId)).where(eq(roundRuns.roundId, ctx.round.id)),
  ]);
  // The round's flags with each submitted report's verdict; names only where the policy shows them.
  const nameOf = new Map(reviewRows.map((r) => [r.number, r.name]));
  const who = (n: number) => (opts.showReviewerNames && nameOf.get(n) ? `Reviewer ${n} (${nameOf.get(n)})` : `Reviewer ${n}`);
  const flagVerdicts = Object.fromEntries(Object.entries(verdictRows).map(([id, list]) => [id, list.map((v) => ({ reviewer: who(v.number), verdict: v.verdict, reason: v.reason }))]));
  const label = await anchorLabels(db, ctx.round.id);
  const flagName = new Map(flagRows.map((f) => [f.id, `${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}`]));
  // Drafts stay private to the reviewer until submitted: only submitted reports' parts are read.
  const partsOf = await reportPartsOf(db, reviewRows.filter((r) => r.state === "submitted").map((r) => r.id));
  const reports = reviewRows.map((r) => {
      const parts = partsOf.get(r.id) ?? { verdicts: [], remarks: [] };
      const visible = r.state === "submitted";
      return {
        ...r,
        editorNote: visible ? renderRichText(r.editorNote) : "",
        remarks: visible ? parts.remarks.map((m) => ({ id: m.id, anchor: label(m.anchorKind, m.anchorRef), html: renderRichText(m.body) })) : [],
        verdicts: visible ? parts.verdicts.map((v) => ({ flag: flagName.get(v.flagId) ?? v.flagId, verdict: v.verdict })) : [],
      };
    });
  const counts = { mismatch: 0, caution: 0, note: 0 } as Record<string, number>;
  for (const f of flagRows) counts[f.severity] = (counts[f.severity] ?? 0) + 1;
  return { invites, reports, audit, flagCounts: counts, flagTotal: flagRows.length, hasPrevious: previous.length > 0, flagVerdicts, runs: runLinks };
}

