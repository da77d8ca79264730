import { and, eq, like } from "drizzle-orm";
import type { Database } from "~db/client";
import { roundRuns, runs, runVersions } from "~db/schema";
import { LIMITS, type RunRecord } from "~/checker/schema";
import { markRoundChanged, requestRecheck } from "./recheck.server";
import { draftRoundById } from "./rounds.server";
import { createRun } from "./runs.server";
import { StateConflict } from "./types";

/** `<label> (copy)`, or `(copy 2)`, `(copy 3)`, … when taken; the base is shortened to fit the label limit. */
export function copyLabel(label: string, taken: ReadonlySet<string>): string {
  for (let n = 1; n <= taken.size + 1; n++) {
    const suffix = n === 1 ? " (copy)" : ` (copy ${n})`;
    const candidate = label.slice(0, LIMITS.shortText - suffix.length) + suffix;
    if (!taken.has(candidate)) return candidate;
  }
  throw new Error("unreachable: one of taken.size + 1 candidates is free");
}

/**
 * "Duplicate as template": a new run in the same draft round whose first version is the record this
 * round uses, under a label of its own. Attached series and spectra are not copied (they belong to
 * the run that produced them). One transaction, then the round's check is queued.
 */
export async function duplicateRun(db: Database, opts: { submissionId: string; roundId: string; runId: string; userId: string }) {
  await draftRoundById(db, opts.roundId);
  const out = await db.transaction(async (tx) => {
    const [source] = await tx
      .select({ label: runs.label, record: runVersions.record })
      .from(roundRuns)
      .innerJoin(runs, eq(runs.id, roundRuns.runId))
      .innerJoin(runVersions, eq(runVersions.id, roundRuns.runVersionId))
      .where(and(eq(roundRuns.roundId, opts.roundId), eq(roundRuns.runId, opts.runId)));
    if (!source) throw new StateConflict("This run is no longer part of the round: reload the page.");
    const prefix = source.label.slice(0, LIMITS.shortText - 7).replace(/[\\%_]/g, "\\$&");
    const taken = await tx.select({ label: runs.label }).from(runs).where(and(eq(runs.submissionId, opts.submissionId), like(runs.label, `${prefix}%`)));
    const label = copyLabel(source.label, new Set(taken.map((t) => t.label)));
    const record = { ...(source.record as RunRecord), label };
    const created = await createRun(tx, { submissionId: opts.submissionId, roundId: opts.roundId, record, origin: "copy", userId: opts.userId });
    await markRoundChanged(tx, opts.roundId);
    return created;
  });
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  return out;
}
