import { and, desc, eq, inArray, max } from "drizzle-orm";
import { attachments, roundRuns, runs, runVersions } from "~db/schema";
import { runSchema, type RunRecord } from "~/checker/schema";
import { zodIssues } from "./zod-issues";
import { InvalidInput, StateConflict, type Tx } from "./types";

export type RunOrigin = "form" | "json" | "namelist" | "api" | "seed" | "copy";

/** Validates a candidate run record; throws InvalidInput with the JSON path of each problem. */
export function parseRunRecord(input: unknown): RunRecord {
  const parsed = runSchema.safeParse(input);
  if (!parsed.success) throw new InvalidInput("The run record does not follow runproof.run/1.", zodIssues(parsed.error));
  return parsed.data;
}

/** Adds a run to a draft round: the run, its first version and the round's pointer, together. */
export async function createRun(
  tx: Tx,
  opts: { submissionId: string; roundId: string; record: RunRecord; origin: RunOrigin; userId: string | null },
) {
  const [clash] = await tx
    .select({ id: runs.id })
    .from(runs)
    .where(and(eq(runs.submissionId, opts.submissionId), eq(runs.label, opts.record.label)));
  if (clash) {
    throw new InvalidInput(`A run labelled "${opts.record.label}" already exists in this submission.`, [
      { path: "label", message: "Labels are unique within a submission: choose another, or edit the existing run." },
    ]);
  }
  const [run] = await tx
    .insert(runs)
    .values({ submissionId: opts.submissionId, label: opts.record.label, createdBy: opts.userId })
    .returning();
  const [version] = await tx
    .insert(runVersions)
    .values({ runId: run!.id, version: 1, record: opts.record, origin: opts.origin, createdBy: opts.userId })
    .returning();
  await tx.insert(roundRuns).values({ roundId: opts.roundId, runId: run!.id, runVersionId: version!.id });
  return { run: run!, version: version! };
}

/**
 * Edits a run: a new version, and the draft round points at it. `expectedVersion` (when given)
 * must be the latest version, else someone else edited first.
 */
export async function reviseRun(
  tx: Tx,
  opts: { runId: string; roundId: string; record: RunRecord; origin: RunOrigin; userId: string | null; expectedVersion?: number },
) {
  const [run] = await tx.select().from(runs).where(eq(runs.id, opts.runId)).for("update");
  if (!run) throw new InvalidInput("No such run.", [{ path: "runId", message: "The run does not exist." }]);
  if (opts.record.label !== run.label) {
    throw new InvalidInput("The label of an existing run cannot change.", [
      { path: "label", message: `Keep "${run.label}", or create a new run with the new label.` },
    ]);
  }
  const [{ latest } = { latest: 0 }] = await tx
    .select({ latest: max(runVersions.version) })
    .from(runVersions)
    .where(eq(runVersions.runId, run.id));
  const current = latest ?? 0;
  if (opts.expectedVersion !== undefined && opts.expectedVersion !== current) {
    throw new StateConflict(`Run ${run.label} is at version ${current}, not ${opts.expectedVersion}: reload and apply your change again.`);
  }
  const [version] = await tx
    .insert(runVersions)
    .values({ runId: run.id, version: current + 1, record: opts.record, origin: opts.origin, createdBy: opts.userId })
    .returning();
  // The new version keeps the series and spectra the round's previous version had attached.
  const [previous] = await tx
    .select({ id: roundRuns.runVersionId })
    .from(roundRuns)
    .where(and(eq(roundRuns.roundId, opts.roundId), eq(roundRuns.runId, run.id)));
  if (previous) {
    const kept = await tx.select().from(attachments).where(and(eq(attachments.runVersionId, previous.id), eq(attachments.active, true)));
    if (kept.length) {
      await tx.insert(attachments).values(kept.map(({ id: _id, createdAt: _c, ...a }) => ({ ...a, runVersionId: version!.id })));
    }
  }
  await tx
    .insert(roundRuns)
    .values({ roundId: opts.roundId, runId: run.id, runVersionId: version!.id })
    .onConflictDoUpdate({ target: [roundRuns.roundId, roundRuns.runId], set: { runVersionId: version!.id, checkedKey: null } });
  return { run, version: version! };
}

function roundRunRows(db: Tx | import("~db/client").Database) {
  return db
    .select({
      runId: runs.id,
      label: runs.label,
      versionId: runVersions.id,
      version: runVersions.version,
      record: runVersions.record,
      origin: runVersions.origin,
      updatedAt: runVersions.createdAt,
      checkedKey: roundRuns.checkedKey,
    })
    .from(roundRuns)
    .innerJoin(runs, eq(runs.id, roundRuns.runId))
    .innerJoin(runVersions, eq(runVersions.id, roundRuns.runVersionId));
}

/** The runs of a round with the version the round uses. */
export async function roundRunList(db: Tx | import("~db/client").Database, roundId: string) {
  return roundRunRows(db).where(eq(roundRuns.roundId, roundId)).orderBy(runs.label);
}

/** The runs of a round by label only (links and pickers): no records read. */
export async function roundRunLabels(db: Tx | import("~db/client").Database, roundId: string) {
  return db.select({ runId: runs.id, label: runs.label }).from(roundRuns).innerJoin(runs, eq(runs.id, roundRuns.runId)).where(eq(roundRuns.roundId, roundId)).orderBy(runs.label);
}

/** The runs of a round with the given labels, with the version the round uses. */
export async function roundRunsLabelled(db: Tx | import("~db/client").Database, roundId: string, labels: string[]) {
  return labels.length ? roundRunRows(db).where(and(eq(roundRuns.roundId, roundId), inArray(runs.label, labels))).orderBy(runs.label) : [];
}

/** The runs of a round with the given labels: the version the round uses, without its record. */
export async function roundRunVersionsLabelled(db: Tx | import("~db/client").Database, roundId: string, labels: string[]) {
  if (!labels.length) return [];
  return db
    .select({ label: runs.label, versionId: roundRuns.runVersionId })
    .from(roundRuns)
    .innerJoin(runs, eq(runs.id, roundRuns.runId))
    .where(and(eq(roundRuns.roundId, roundId), inArray(runs.label, labels)))
    .orderBy(runs.label);
}

/** One run of a round with the version the round uses, or undefined when the round has no such run. */
export async function roundRun(db: Tx | import("~db/client").Database, roundId: string, runId: string) {
  const [run] = await roundRunRows(db).where(and(eq(roundRuns.roundId, roundId), eq(roundRuns.runId, runId)));
  return run;
}

export async function runVersionHistory(db: import("~db/client").Database, runId: string) {
  return db
    .select({ id: runVersions.id, version: runVersions.version, origin: runVersions.origin, record: runVersions.record, createdAt: runVersions.createdAt })
    .from(runVersions)
    .where(eq(runVersions.runId, runId))
    .orderBy(desc(runVersions.version));
}
