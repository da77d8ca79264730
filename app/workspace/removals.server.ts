import { and, eq, inArray, ne, notInArray } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, claims, flags, roundRuns, rounds, runs, runVersions, storedFiles, submissions } from "~db/schema";
import type { ClaimRecord } from "~/checker/schema";
import { storage } from "~/storage/storage.server";
import { markRoundChanged, requestRecheck } from "./recheck.server";
import { draftRoundById } from "./rounds.server";
import { StateConflict, type Tx } from "./types";

/** Claims of a round that name a run label, by their titles (what the author sees). */
export async function claimsNamingRun(db: Database | Tx, roundId: string, label: string) {
  const rows = await db.select({ id: claims.id, figure: claims.figure, record: claims.record }).from(claims).where(eq(claims.roundId, roundId));
  return rows
    .filter((c) => ((c.record as ClaimRecord).runs ?? []).some((r) => r.label === label))
    .map((c) => ({ id: c.id, title: [c.figure, (c.record as ClaimRecord).title].filter(Boolean).join(": ") || "untitled claim" }));
}

/**
 * Stored files that only the given attachments use (versions share a file when a run is edited):
 * their rows are deleted in the caller's transaction, their objects after it commits.
 */
async function filesOnlyUsedBy(tx: Tx, versionIds: string[]) {
  if (!versionIds.length) return [];
  const used = await tx.selectDistinct({ fileId: attachments.fileId }).from(attachments).where(inArray(attachments.runVersionId, versionIds));
  const ids = used.map((u) => u.fileId);
  if (!ids.length) return [];
  const elsewhere = await tx
    .selectDistinct({ fileId: attachments.fileId })
    .from(attachments)
    .where(and(inArray(attachments.fileId, ids), notInArray(attachments.runVersionId, versionIds)));
  const keep = new Set(elsewhere.map((e) => e.fileId));
  return tx.select({ id: storedFiles.id, key: storedFiles.key }).from(storedFiles).where(inArray(storedFiles.id, ids.filter((i) => !keep.has(i))));
}

async function removeObjects(keys: string[]) {
  // The rows are gone already; an object that cannot be removed now is only unreferenced storage.
  for (const key of keys) await storage.remove(key).catch((e) => console.warn(`storage: could not remove ${key}:`, e instanceof Error ? e.message : e));
}

/**
 * Removes a run from a draft round. A run that claims of the round name is refused, naming those
 * claims (remove the run from them, or delete them, first). A run that earlier rounds used stays
 * for them: only this round's pointer and flags go; a run only this round used goes with its
 * versions, attachments and their files. One transaction, then the round's check is queued.
 */
export async function deleteRun(db: Database, opts: { roundId: string; runId: string }) {
  await draftRoundById(db, opts.roundId);
  const orphanKeys = await db.transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(eq(runs.id, opts.runId)).for("update");
    const [pointer] = run ? await tx.select().from(roundRuns).where(and(eq(roundRuns.roundId, opts.roundId), eq(roundRuns.runId, run.id))) : [];
    if (!run || !pointer) throw new StateConflict("This run is no longer part of the round: reload the page.");
    const naming = await claimsNamingRun(tx, opts.roundId, run.label);
    if (naming.length) {
      throw new StateConflict(
        `Run "${run.label}" is named by ${naming.length === 1 ? "the claim" : `${naming.length} claims`} ${naming.map((c) => `"${c.title}"`).join(", ")}; nothing was deleted. Take the run out of ${naming.length === 1 ? "that claim" : "those claims"} (or delete ${naming.length === 1 ? "it" : "them"}) first.`,
      );
    }
    const usedElsewhere = await tx.select({ roundId: roundRuns.roundId }).from(roundRuns).where(and(eq(roundRuns.runId, run.id), ne(roundRuns.roundId, opts.roundId)));
    await tx.delete(flags).where(and(eq(flags.roundId, opts.roundId), eq(flags.runLabel, run.label)));
    let files: { id: string; key: string }[] = [];
    if (usedElsewhere.length) {
      await tx.delete(roundRuns).where(and(eq(roundRuns.roundId, opts.roundId), eq(roundRuns.runId, run.id)));
    } else {
      const versions = await tx.select({ id: runVersions.id }).from(runVersions).where(eq(runVersions.runId, run.id));
      files = await filesOnlyUsedBy(tx, versions.map((v) => v.id));
      await tx.delete(runs).where(eq(runs.id, run.id)); // versions, pointers, attachments and checks cascade
      if (files.length) await tx.delete(storedFiles).where(inArray(storedFiles.id, files.map((f) => f.id)));
    }
    await markRoundChanged(tx, opts.roundId);
    return { label: run.label, keys: files.map((f) => f.key) };
  });
  await requestRecheck(db, opts.roundId, { alreadyMarked: true });
  await removeObjects(orphanKeys.keys);
  return { label: orphanKeys.label };
}

/** What deleting a draft submission removes, for the confirmation the author reads first. */
export async function draftSubmissionContents(db: Database, submissionId: string) {
  const roundRows = await db.select({ state: rounds.state }).from(rounds).where(eq(rounds.submissionId, submissionId));
  const runRows = await db.select({ id: runs.id }).from(runs).where(eq(runs.submissionId, submissionId));
  const claimRows = await db
    .select({ id: claims.id })
    .from(claims)
    .innerJoin(rounds, eq(rounds.id, claims.roundId))
    .where(eq(rounds.submissionId, submissionId));
  return { rounds: roundRows.length, neverSent: roundRows.every((r) => r.state === "draft"), runs: runRows.length, claims: claimRows.length };
}

/**
 * Deletes a submission that was never sent: its draft round, runs, claims, flags, contributors and
 * files, in one transaction (the objects in storage after it commits). Once any round was sent the
 * editor holds it, and it cannot be deleted (409).
 */
export async function deleteDraftSubmission(db: Database, submissionId: string) {
  const keys = await db.transaction(async (tx) => {
    const [sub] = await tx.select().from(submissions).where(eq(submissions.id, submissionId)).for("update");
    if (!sub) throw new StateConflict("This submission no longer exists.");
    const roundRows = await tx.select({ number: rounds.number, state: rounds.state }).from(rounds).where(eq(rounds.submissionId, submissionId)).for("update");
    const sent = roundRows.find((r) => r.state !== "draft");
    if (sent || sub.stage !== "draft") {
      throw new StateConflict(`Round ${sent?.number ?? 1} was sent to the editor, so the submission can no longer be deleted; to stop it, ask the editor to withdraw it.`);
    }
    const versionIds = (
      await tx.select({ id: runVersions.id }).from(runVersions).innerJoin(runs, eq(runs.id, runVersions.runId)).where(eq(runs.submissionId, submissionId))
    ).map((v) => v.id);
    const files = await filesOnlyUsedBy(tx, versionIds);
    const manuscript = sub.manuscriptFileId ? await tx.select({ id: storedFiles.id, key: storedFiles.key }).from(storedFiles).where(eq(storedFiles.id, sub.manuscriptFileId)) : [];
    await tx.delete(submissions).where(eq(submissions.id, submissionId)); // rounds, runs, claims, flags, members cascade
    const all = [...files, ...manuscript];
    if (all.length) await tx.delete(storedFiles).where(inArray(storedFiles.id, all.map((f) => f.id)));
    return all.map((f) => f.key);
  });
  await removeObjects(keys);
}
