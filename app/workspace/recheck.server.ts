import { and, eq, inArray } from "drizzle-orm";
import type { Database } from "~db/client";
import { attachments, flags, rounds, submissions, venues } from "~db/schema";
import { check, CheckInputError } from "~/checker";
import type { ClaimRecord, Columns, RunRecord } from "~/checker/schema";
import type { Flag } from "~/checker/types";
import { roundClaims } from "./claims.server";
import { roundRunList } from "./runs.server";

export function fingerprintOf(f: { rule: string; run?: string | null; quantities: string[] }, claimLineage?: string | null) {
  return [f.rule, f.run ?? "", claimLineage ?? "", [...f.quantities].sort().join(",")].join("|");
}

/** Everything the checker needs for a round, loaded in a handful of queries. */
export async function loadRoundInputs(db: Database, roundId: string) {
  const [round] = await db
    .select({ id: rounds.id, policy: venues.checkerPolicy })
    .from(rounds)
    .innerJoin(submissions, eq(submissions.id, rounds.submissionId))
    .innerJoin(venues, eq(venues.id, submissions.venueId))
    .where(eq(rounds.id, roundId));
  if (!round) throw new Error(`round ${roundId} not found`);
  const runRows = await roundRunList(db, roundId);
  const files = runRows.length
    ? await db
        .select({ runVersionId: attachments.runVersionId, kind: attachments.kind, data: attachments.data })
        .from(attachments)
        .where(and(inArray(attachments.runVersionId, runRows.map((r) => r.versionId)), eq(attachments.active, true)))
    : [];
  const labelOf = new Map(runRows.map((r) => [r.versionId, r.label]));
  const series: Record<string, Columns> = {};
  const spectra: Record<string, Columns> = {};
  for (const f of files) (f.kind === "series" ? series : spectra)[labelOf.get(f.runVersionId)!] = f.data;
  const claimRows = await roundClaims(db, roundId);
  return {
    policy: round.policy,
    runs: runRows.map((r) => r.record as RunRecord),
    runRows,
    series,
    spectra,
    claims: claimRows,
  };
}

export type RoundFlag = Flag & { claimId: string | null; lineage: string | null };
export type RoundCheck = Awaited<ReturnType<typeof checkRound>>;

/** Runs the checker over a round: per-run flags once, then each claim's own flags. Throws when the checker does. */
export async function checkRound(db: Database, roundId: string) {
  const inputs = await loadRoundInputs(db, roundId);
  return { inputs, ...checkInputs(inputs) };
}

function checkInputs(inputs: Awaited<ReturnType<typeof loadRoundInputs>>) {
  const policy = inputs.policy as never;
  if (inputs.runs.length === 0) return { runResults: [], flags: [] as RoundFlag[] };
  const base = check({ runs: inputs.runs, series: inputs.series, spectra: inputs.spectra, policy });
  const all: RoundFlag[] = base.runs.flatMap((r) => r.flags.map((f) => ({ ...f, run: f.run ?? r.label, claimId: null, lineage: null })));
  for (const claim of inputs.claims) {
    let out;
    try {
      out = check({ runs: inputs.runs, claim: claim.record as ClaimRecord, series: inputs.series, spectra: inputs.spectra, policy });
    } catch (e) {
      throw new ClaimCheckFailure(claim.figure || (claim.record as { title?: string }).title || "untitled claim", e);
    }
    all.push(...out.claimFlags.map((f) => ({ ...f, claimId: claim.id, lineage: claim.lineage })));
  }
  return { runResults: base.runs, flags: all };
}

class ClaimCheckFailure extends Error {
  constructor(
    readonly claim: string,
    readonly inner: unknown,
  ) {
    super(`claim "${claim}"`);
  }
}

/** Why a check failed, in words a person can act on: runs by label, never by index. */
export function describeCheckFailure(e: unknown, runLabels: string[]): string {
  const where = e instanceof ClaimCheckFailure ? `In the claim "${e.claim}": ` : "";
  const inner = e instanceof ClaimCheckFailure ? e.inner : e;
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

/**
 * Recomputes and stores a round's flags in one transaction. Authors' answers to a flag carry
 * over to the same finding (same fingerprint) after the re-check. When the checker fails, the
 * round records why (`checkError`): its stored flags are then shown as out of date, never as
 * current, and the round cannot be sent until a check succeeds.
 */
export async function recheckRound(db: Database, roundId: string) {
  const inputs = await loadRoundInputs(db, roundId);
  let computed: ReturnType<typeof checkInputs>;
  try {
    computed = checkInputs(inputs);
  } catch (e) {
    if (!(e instanceof CheckInputError) && !(e instanceof ClaimCheckFailure && e.inner instanceof CheckInputError)) {
      console.error(`check of round ${roundId} failed`, e);
    }
    const checkError = describeCheckFailure(e, inputs.runs.map((r) => r.label));
    await db.update(rounds).set({ checkError, checkedAt: new Date() }).where(eq(rounds.id, roundId));
    return { inputs, runResults: [], flags: [] as RoundFlag[], checkError };
  }
  const result = { inputs, ...computed, checkError: null };
  await db.transaction(async (tx) => {
    const previous = await tx
      .select({ fingerprint: flags.fingerprint, answer: flags.authorAnswer, by: flags.answeredBy })
      .from(flags)
      .where(eq(flags.roundId, roundId));
    const answers = new Map(previous.filter((p) => p.answer).map((p) => [p.fingerprint, p]));
    await tx.delete(flags).where(eq(flags.roundId, roundId));
    if (result.flags.length) {
      await tx.insert(flags).values(
        result.flags.map(({ rule, severity, quantities, message, run, claimId, lineage, ...detail }) => {
          const fingerprint = fingerprintOf({ rule, run, quantities }, lineage);
          const kept = answers.get(fingerprint);
          return {
            roundId,
            fingerprint,
            rule,
            severity,
            runLabel: run ?? null,
            claimId,
            quantities,
            message,
            detail: detail as Record<string, unknown>,
            authorAnswer: kept?.answer ?? null,
            answeredBy: kept?.by ?? null,
          };
        }),
      );
    }
    await tx.update(rounds).set({ checkedAt: new Date(), checkError: null }).where(eq(rounds.id, roundId));
  });
  return result;
}
