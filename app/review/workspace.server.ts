import { asc, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { contributors } from "~db/schema";
import type { RunRecord } from "~/checker/schema";
import { roundClaims } from "~/workspace/claims.server";
import { roundFlagCount } from "~/workspace/flag-panel.server";
import { roundRunRows, roundRunsWithPlots } from "~/workspace/round-data.server";
import type { RoundContext } from "./round-context.server";
import { anchorLabels } from "./remarks.server";
import { reportParts } from "./reviews.server";
import { renderRichText } from "./tiptap/render.server";

/**
 * The frozen round as the reviewer reads it, plus their own report. Authors' names appear only
 * at single-blind venues; no other reviewer's anything is selected.
 */
export async function reviewerView(db: Database, ctx: RoundContext, review: { id: string }, opts: { showAuthors: boolean }) {
  const [claimRows, runRows, withPlots, flagTotal, parts, people] = await Promise.all([
    roundClaims(db, ctx.round.id),
    roundRunRows(db, ctx.round.id),
    roundRunsWithPlots(db, ctx.round.id),
    roundFlagCount(db, ctx.round.id),
    reportParts(db, review.id),
    !opts.showAuthors
      ? Promise.resolve([])
      : (ctx.round.sentContributors ??
        db.select({ name: contributors.name, affiliation: contributors.affiliation }).from(contributors).where(eq(contributors.submissionId, ctx.submission.id)).orderBy(asc(contributors.position))),
  ]);
  const label = await anchorLabels(db, ctx.round.id);
  return {
    authors: people.map((p) => ({ name: p.name, affiliation: p.affiliation })),
    claims: claimRows.map((c) => {
      const rec = c.record as { title?: string; runs?: { label: string; part: string }[]; stated?: { quantity: string; value: string; run?: string }[] };
      return { id: c.id, figure: c.figure, statement: c.statement, title: rec.title ?? "", runs: rec.runs ?? [], stated: rec.stated ?? [] };
    }),
    runRows,
    // Which runs have plots; each run's plot copies load when the reviewer asks for them.
    plots: withPlots,
    // The flags themselves come from the table's rows route once the page is on screen.
    flagTotal,
    verdicts: Object.fromEntries(parts.verdicts.map((v) => [v.flagId, { verdict: v.verdict, reason: v.reason }])) as Record<string, { verdict: string; reason: string | null }>,
    // The reviewer's own remarks come with their JSON too, so they can be edited until submitted.
    remarks: parts.remarks.map((m) => ({ id: m.id, anchorKind: m.anchorKind, anchorRef: m.anchorRef, anchor: label(m.anchorKind, m.anchorRef), html: renderRichText(m.body), body: m.body })),
  };
}
