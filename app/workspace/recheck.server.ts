import { createHash } from "node:crypto";
import { and, eq, inArray, isNull, notInArray, or, sql } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, claims, flags, roundRuns, rounds, runChecks, storedFiles, submissions, venues, type AttachmentAnalysis } from "~db/schema";
import { CheckInputError, ClaimCheckError, policySchema, resolvePolicy, type SeriesStats, type StatedComparison } from "~/checker";
import { readSeriesFile, SERIES_FORMATS, type SeriesFormat } from "~/checker/series-formats";
import type { ClaimRecord, Columns, RunRecord } from "~/checker/schema";
import type { Derived, Flag } from "~/checker/types";
import { queueRecheck } from "~/jobs/check-queue.server";
import { storage } from "~/storage/storage.server";
import { CheckerBusy, CheckerOverBudget, runChecker, transferablesOf } from "~/threads/checker-pool.server";
import { roundRunList } from "./runs.server";
import type { Db, Tx } from "./types";

export function fingerprintOf(f: { rule: string; run?: string | null; quantities: string[] }, claimLineage?: string | null) {
  return [f.rule, f.run ?? "", claimLineage ?? "", [...f.quantities].sort().join(",")].join("|");
}

const digest = (...parts: unknown[]) => createHash("sha256").update(JSON.stringify(parts)).digest("hex").slice(0, 32);

/**
 * Records, inside the transaction of a change, that the round's stored checks no longer describe
 * it: pages show "checking…" until the check job has caught up (`checkedSeq` ≥ this `changeSeq`).
 */
export async function markRoundChanged(tx: Db | Tx, roundId: string) {
  await tx.update(rounds).set({ changeSeq: sql`${rounds.changeSeq} + 1` }).where(eq(rounds.id, roundId));
}

/**
 * After a committed change: marks the round changed and queues its check for the worker
 * processes (`npm run worker`). Returns at once; nothing is checked in the caller's process.
 */
export async function requestRecheck(db: Database, roundId: string, opts: { alreadyMarked?: boolean } = {}) {
  if (!opts.alreadyMarked) await markRoundChanged(db, roundId);
  // A failed send is not lost: the worker's sweep finds every round whose changeSeq is ahead.
  await queueRecheck(roundId).catch((e) => console.warn("checks: could not queue a round check:", e instanceof Error ? e.message : e));
}

/** The check state of a round as pages show it. */
export async function roundCheckState(db: Db, roundId: string) {
  const [row] = await db.select({ changeSeq: rounds.changeSeq, checkedSeq: rounds.checkedSeq, checkedAt: rounds.checkedAt }).from(rounds).where(eq(rounds.id, roundId));
  return { checking: !!row && row.checkedSeq < row.changeSeq, checkedAt: row?.checkedAt ?? null };
}

type FileRow = { id: string; runVersionId: string; kind: "series" | "spectrum"; key: string; analysis: AttachmentAnalysis | null; format: string; sourceMap: string | null; size: number };

/**
 * Analyses a stored file again from object storage (first check after an upgrade, or a changed
 * MSER batch). The file is read here; the analysis runs in a checker thread, the columns moved to it.
 */
async function analyseStored(db: Db, f: FileRow, batch: number): Promise<AttachmentAnalysis> {
  const body = await storage.getStream(f.key);
  const format = (SERIES_FORMATS as readonly string[]).includes(f.format) ? (f.format as SeriesFormat) : "csv";
  // The stored file passed the upload limit on arrival; it is read up to the size recorded then.
  const cols = await readSeriesFile(body as unknown as AsyncIterable<Uint8Array>, { kind: f.kind, format, map: f.sourceMap, limitBytes: f.size });
  const { analysis, plot } = await runChecker({ kind: "analyse-file", fileKind: f.kind, columns: cols, batch }, { transferList: transferablesOf(cols) });
  await db.update(attachments).set({ analysis, plot }).where(eq(attachments.id, f.id));
  return analysis;
}

const needsAnalysis = (a: AttachmentAnalysis | null, kind: string, batch: number) => !a || a.kind !== kind || (a.kind === "series" && a.batch !== batch);

const num = (v: number | undefined) => (v === undefined || !Number.isFinite(v) ? null : v);

/** A stored file that could not be analysed again, named by its run's label. */
class FileAnalysisFailure extends Error {
  constructor(
    readonly run: string,
    readonly kind: string,
    readonly inner: unknown,
  ) {
    super(`the ${kind} file of run "${run}"`);
  }
}

/** Why a check failed, in words a person can act on: runs by label, never by index. */
export function describeCheckFailure(e: unknown, runLabels: string[], claimNames: string[] = []): string {
  const claim = e instanceof ClaimCheckError ? (claimNames[e.claimIndex] ?? `#${e.claimIndex + 1}`) : null;
  const where = claim !== null ? `In the claim "${claim}": ` : e instanceof FileAnalysisFailure ? `Reading ${e.message}: ` : "";
  const inner = e instanceof ClaimCheckError || e instanceof FileAnalysisFailure ? e.inner : e;
  if (inner instanceof CheckerOverBudget) {
    return `${where}${inner.message}. Make the series shorter (for example every n-th row) or split the runs over more rounds; the round is checked again after the next change.`;
  }
  const named = (text: string) =>
    text
      .replace(/\bruns\[(\d+)\](\.)?/g, (_m, i: string, dot?: string) => `run "${runLabels[Number(i)] ?? `#${Number(i) + 1}`}"${dot ? ", " : ""}`)
      .replace(/\bclaim\./g, "");
  if (inner instanceof CheckInputError) {
    const list = inner.errors.slice(0, 5).map((x) => `${named(x.path)}: ${named(x.message)}`);
    const more = inner.errors.length > 5 ? ` (and ${inner.errors.length - 5} more)` : "";
    return `${where}${list.join("; ")}${more}. Correct it and the round is checked again.`;
  }
  const msg = inner instanceof Error ? inner.message : String(inner);
  return `${where}the checker stopped with an internal error (${msg.slice(0, 300)}). Change or remove the last edit, or tell the venue's editors.`;
}

/** How people know a claim: its figure, else its title. */
const claimName = (c: { figure: string | null; record: unknown }) => c.figure || (c.record as { title?: string } | null)?.title || "untitled claim";

const isInputProblem = (e: unknown) => e instanceof CheckInputError || (e instanceof ClaimCheckError && e.inner instanceof CheckInputError);

/**
 * Brings a round's stored checks up to date, incrementally and idempotently:
 * - files without an analysis (or analysed under another MSER batch) are analysed once;
 * - a run is re-checked only when its inputs key (policy, version, files) changed;
 * - a claim is re-checked only when it or a run it names changed;
 * - everything is written in one transaction, with authors' answers kept by fingerprint.
 * Running it twice does nothing the second time. The check job calls it; so do the seed and tests.
 * When the check fails (a stored record the checker refuses, a file that cannot be read, an
 * internal error), the round records why (`checkError`) and its flags are left untouched: pages
 * show them as out of date, never as current, and the round cannot be sent. Nothing is marked
 * checked, so the next check tries the same runs and claims again; a good check clears the error.
 */
export async function recheckRound(db: Database, roundId: string) {
  const [round] = await db
    .select({ id: rounds.id, policy: venues.checkerPolicy, changeSeq: rounds.changeSeq })
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(eq(rounds.id, roundId));
  if (!round) return { runsChecked: 0, claimsChecked: 0, checkError: null };
  const parsedPolicy = policySchema.safeParse(round.policy ?? {});
  const policyInput = parsedPolicy.success ? parsedPolicy.data : {};
  const batch = resolvePolicy(policyInput).mserBatch;
  const policyKey = digest(policyInput);

  const runRows = await roundRunList(db, roundId);
  const versionIds = runRows.map((r) => r.versionId);
  const files: FileRow[] = versionIds.length
    ? await db
        .select({ id: attachments.id, runVersionId: attachments.runVersionId, kind: attachments.kind, key: storedFiles.key, analysis: attachments.analysis, format: attachments.format, sourceMap: attachments.sourceMap, size: storedFiles.size })
        .from(attachments)
        .innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId))
        .where(and(inArray(attachments.runVersionId, versionIds), eq(attachments.active, true)))
    : [];
  const labelOf = new Map(runRows.map((r) => [r.versionId, r.label]));
  const seriesStats: Record<string, SeriesStats> = {};
  const spectra: Record<string, Columns> = {};
  const filesOf = new Map<string, string[]>();
  const failed = async (e: unknown, claimNames: string[] = []) => {
    const inner = e instanceof FileAnalysisFailure ? e.inner : e;
    // A full pool is no fault of the round: the job fails and pg-boss runs it again.
    if (inner instanceof CheckerBusy) throw inner;
    if (inner instanceof CheckerOverBudget) console.warn(`checks: round ${roundId}: ${inner.message}`);
    else if (!isInputProblem(e)) console.error(`checks: round ${roundId} could not be checked:`, e);
    const checkError = describeCheckFailure(e, runRows.map((r) => r.label), claimNames);
    await db.transaction(async (tx) => {
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`recheck:${roundId}`}))`);
      // The check ran to its end (a failure): the round is no longer "checking", its flags are out of date.
      await tx
        .update(rounds)
        .set({ checkError, checkedSeq: sql`greatest(${rounds.checkedSeq}, ${round.changeSeq})`, checkedAt: new Date() })
        .where(eq(rounds.id, roundId));
    });
    return { runsChecked: 0, claimsChecked: 0, checkError };
  };
  for (const f of files) {
    const label = labelOf.get(f.runVersionId)!;
    let analysis: AttachmentAnalysis;
    try {
      analysis = needsAnalysis(f.analysis, f.kind, batch) ? await analyseStored(db, f, batch) : f.analysis!;
    } catch (e) {
      return failed(new FileAnalysisFailure(label, f.kind, e));
    }
    if (analysis.kind === "series" && analysis.stats) seriesStats[label] = analysis.stats as SeriesStats;
    if (analysis.kind === "spectrum") spectra[label] = analysis.columns;
    filesOf.set(f.runVersionId, [...(filesOf.get(f.runVersionId) ?? []), `${f.id}:${analysis.kind === "series" ? analysis.batch : ""}`].sort());
  }

  const runKey = new Map(runRows.map((r) => [r.label, digest(policyKey, r.versionId, filesOf.get(r.versionId) ?? [])]));
  // A run's flags in this round are current when the round's pointer carries the run's inputs key.
  const changedRuns = runRows.filter((r) => r.checkedKey !== runKey.get(r.label));

  const claimRows = await db.select({ id: claims.id, lineage: claims.lineage, figure: claims.figure, record: claims.record, version: claims.version, checkedKey: claims.checkedKey }).from(claims).where(eq(claims.roundId, roundId));
  const claimKey = (c: (typeof claimRows)[number]) => {
    const named = ((c.record as ClaimRecord).runs ?? []).map((r) => r.label);
    // "stated-results" once: claims checked before their stated results were stored are checked again.
    return digest(policyKey, c.id, c.version, named.map((l) => runKey.get(l) ?? `missing:${l}`), "stated-results");
  };
  const changedClaims = claimRows.filter((c) => c.checkedKey !== claimKey(c));

  let runResults: { label: string; derived: Derived; flags: Flag[] }[] = [];
  let claimFlags: Flag[][] = [];
  let claimComparisons: StatedComparison[][] = [];
  if (changedRuns.length || changedClaims.length) {
    try {
      // Contexts of every run are cheap (no series is read); flags are kept only for what changed.
      // The evaluation runs in a checker thread (time and memory bounded); the writes stay here.
      const input = { runs: runRows.map((r) => r.record as RunRecord), policy: policyInput, seriesStats, spectra, claims: changedClaims.map((c) => c.record as ClaimRecord) };
      const out = await runChecker({ kind: "round-check", input });
      runResults = out.runs;
      claimFlags = out.claimFlags;
      claimComparisons = out.claimComparisons;
    } catch (e) {
      // Records were validated when stored; a stricter checker may refuse one later: the round says why.
      return failed(e, changedClaims.map(claimName));
    }
  }
  const resultOf = new Map(runResults.map((r) => [r.label, r]));
  const labels = runRows.map((r) => r.label);

  await db.transaction(async (tx) => {
    // One check of a round at a time, whichever process runs it.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`recheck:${roundId}`}))`);
    const changedLabels = changedRuns.map((r) => r.label);
    const replaced = or(
      and(isNull(flags.claimId), labels.length ? notInArray(flags.runLabel, labels) : sql`true`),
      and(isNull(flags.claimId), isNull(flags.runLabel)),
      changedLabels.length ? and(isNull(flags.claimId), inArray(flags.runLabel, changedLabels)) : sql`false`,
      changedClaims.length ? inArray(flags.claimId, changedClaims.map((c) => c.id)) : sql`false`,
    );
    const previous = await tx
      .select({ fingerprint: flags.fingerprint, answer: flags.authorAnswer, by: flags.answeredBy })
      .from(flags)
      .where(and(eq(flags.roundId, roundId), replaced));
    const answers = new Map(previous.filter((p) => p.answer).map((p) => [p.fingerprint, p]));
    await tx.delete(flags).where(and(eq(flags.roundId, roundId), replaced));

    const rows: (typeof flags.$inferInsert)[] = [];
    const toRow = (f: Flag, claimId: string | null, lineage: string | null, runVersionId: string | null) => {
      const { rule, severity, quantities, message, run, ...detail } = f;
      const fingerprint = fingerprintOf({ rule, run, quantities }, lineage);
      const kept = answers.get(fingerprint);
      rows.push({
        roundId, fingerprint, rule, severity, runLabel: run ?? null, claimId, runVersionId, quantities, message,
        detail: detail as Record<string, unknown>, authorAnswer: kept?.answer ?? null, answeredBy: kept?.by ?? null,
      });
    };
    for (const r of changedRuns) {
      const result = resultOf.get(r.label);
      const d = (result?.derived ?? {}) as Derived;
      for (const f of result?.flags ?? []) toRow({ ...f, run: f.run ?? r.label }, null, null, r.versionId);
      const values = {
        inputsKey: runKey.get(r.label)!, derived: d as Record<string, unknown>, checkedAt: new Date(),
        e: num(d.E), ra: num(d.Ra), raRotating: num(d.RaRotating), pr: num(d.Pr), pm: num(d.Pm), rm: num(d.Rm), runLengthMagnetic: num(d.runLength?.magnetic),
      };
      await tx.insert(runChecks).values({ runVersionId: r.versionId, ...values }).onConflictDoUpdate({ target: runChecks.runVersionId, set: values });
      await tx.update(roundRuns).set({ checkedKey: values.inputsKey }).where(and(eq(roundRuns.roundId, roundId), eq(roundRuns.runId, r.runId), eq(roundRuns.runVersionId, r.versionId)));
    }
    changedClaims.forEach((c, i) => {
      for (const f of claimFlags[i] ?? []) toRow(f, c.id, c.lineage, null);
    });
    for (let i = 0; i < rows.length; i += 500) await tx.insert(flags).values(rows.slice(i, i + 500));
    for (const [i, c] of changedClaims.entries()) {
      await tx.update(claims).set({ checkedKey: claimKey(c), statedResults: claimComparisons[i] ?? [] }).where(eq(claims.id, c.id));
    }
    await tx
      .update(rounds)
      .set({ checkedSeq: sql`greatest(${rounds.checkedSeq}, ${round.changeSeq})`, checkedAt: new Date(), checkError: null })
      .where(eq(rounds.id, roundId));
  });
  return { runsChecked: changedRuns.length, claimsChecked: changedClaims.length, checkError: null };
}

/** Rounds whose stored checks are behind their last change (the worker's safety sweep). */
export async function roundsBehind(db: Database, limit = 100) {
  const rows = await db.select({ id: rounds.id }).from(rounds).where(sql`${rounds.checkedSeq} < ${rounds.changeSeq}`).limit(limit);
  return rows.map((r) => r.id);
}
