import type { Database } from "~db/client";
import { roundRunList } from "~/workspace/runs.server";
import { roundContext, type RoundContext } from "./round-context.server";
import { diffFlags, diffParameters, groupByRuleAndRun } from "./diff";
import { roundFlags } from "./documents.server";
import { releasedRemarks, responsesTo } from "./remarks.server";
import { renderRichText } from "./tiptap/render.server";
import { releasedVerdicts } from "./verdicts.server";

/** Round N against round N-1: flags diff by fingerprint, parameter diff per run, remarks and answers. */
export async function roundChanges(db: Database, ctx: RoundContext) {
  if (ctx.round.number < 2) return null;
  const prev = await roundContext(db, { submissionId: ctx.submission.id, number: ctx.round.number - 1 });
  const [before, after, runsBefore, runsAfter, remarks, verdicts] = await Promise.all([
    roundFlags(db, prev.round.id),
    roundFlags(db, ctx.round.id),
    roundRunList(db, prev.round.id),
    roundRunList(db, ctx.round.id),
    releasedRemarks(db, prev.round),
    releasedVerdicts(db, prev.round),
  ]);
  const flags = diffFlags(before, after);
  const old = new Map(runsBefore.map((r) => [r.runId, r]));
  const runs = runsAfter.map((r) => {
    const was = old.get(r.runId);
    return {
      label: r.label,
      status: !was ? ("new" as const) : was.versionId === r.versionId ? ("unchanged" as const) : ("revised" as const),
      fromVersion: was?.version ?? null,
      toVersion: r.version,
      changes: was && was.versionId !== r.versionId ? diffParameters(was.record, r.record).map((c) => ({ path: c.path, before: JSON.stringify(c.before) ?? "—", after: JSON.stringify(c.after) ?? "—" })) : [],
    };
  });
  const removed = runsBefore.filter((r) => !runsAfter.some((a) => a.runId === r.runId)).map((r) => r.label);
  const answers = await responsesTo(db, remarks.map((r) => r.id));
  return {
    previousNumber: prev.round.number,
    flags: { added: slim(flags.added), resolved: slim(flags.resolved), persisting: slim(flags.persisting), counts: { added: flags.added.length, resolved: flags.resolved.length, persisting: flags.persisting.length } },
    runs,
    removed,
    // Each flag's verdicts of the previous round as "Reviewer N", with the authors' answers.
    verdicts: verdicts.map((f) => ({ flagId: f.flagId, rule: f.rule, runLabel: f.runLabel, message: f.message, verdicts: f.verdicts.map((v) => ({ reviewer: v.reviewer, number: v.number, verdict: v.verdict, reason: v.reason, answer: v.answer })) })),
    remarks: remarks.map((r) => ({ id: r.id, reviewer: r.reviewer, anchor: r.anchor, html: renderRichText(r.body), response: answers.get(r.id) ?? null })),
  };
}

/** Only what the page shows: never the stored rows (they carry who answered each flag). */
function slim(list: Parameters<typeof groupByRuleAndRun>[0]) {
  return groupByRuleAndRun(list).map((g) => ({ rule: g.rule, runs: g.runs.map((r) => ({ run: r.run, flags: r.flags.map((f) => ({ message: f.message, severity: f.severity })) })) }));
}
