import { and, eq } from "drizzle-orm";
import { claims, flags, remarkResponses, remarks, reviews, roundRuns, rounds } from "~db/schema";
import { InvalidInput, StateConflict, type Db, type Tx } from "~/workspace/types";

/**
 * Opens round N+1 prefilled from round N: the same run versions (pointers, so nothing is
 * copied until an author edits a run) and copies of the claims keeping their `lineage`, so
 * the flags and parameter diffs can pair them with round N.
 */
export async function openRevisionRound(tx: Tx, from: { id: string; submissionId: string; number: number }) {
  const [next] = await tx.insert(rounds).values({ submissionId: from.submissionId, number: from.number + 1, state: "draft" }).returning();
  const pointers = await tx.select().from(roundRuns).where(eq(roundRuns.roundId, from.id));
  if (pointers.length) await tx.insert(roundRuns).values(pointers.map((p) => ({ roundId: next!.id, runId: p.runId, runVersionId: p.runVersionId })));
  const claimRows = await tx.select().from(claims).where(eq(claims.roundId, from.id));
  const copies = claimRows.length
    ? await tx
        .insert(claims)
        .values(claimRows.map((c) => ({ roundId: next!.id, lineage: c.lineage, position: c.position, figure: c.figure, statement: c.statement, record: c.record })))
        .returning({ id: claims.id, lineage: claims.lineage })
    : [];
  // The flags come along too (claims re-pointed by lineage), so the authors' answers carry
  // over by fingerprint when the new round is re-checked.
  const lineageOf = new Map(claimRows.map((c) => [c.id, c.lineage]));
  const copyOf = new Map(copies.map((c) => [c.lineage, c.id]));
  const flagRows = await tx.select().from(flags).where(eq(flags.roundId, from.id));
  if (flagRows.length) {
    await tx.insert(flags).values(
      flagRows.map(({ id: _id, createdAt: _at, ...f }) => ({ ...f, roundId: next!.id, claimId: f.claimId ? (copyOf.get(lineageOf.get(f.claimId)!) ?? null) : null })),
    );
  }
  return next!;
}

/** The authors answer a released remark of round N while round N+1 is their draft. */
export async function saveRemarkResponse(db: Db, opts: { submissionId: string; remarkId: string; response: string; authorId: string }) {
  const [row] = await db
    .select({ roundNumber: rounds.number, releasedAt: rounds.releasedAt })
    .from(remarks)
    .innerJoin(reviews, eq(reviews.id, remarks.reviewId))
    .innerJoin(rounds, eq(rounds.id, reviews.roundId))
    .where(and(eq(remarks.id, opts.remarkId), eq(rounds.submissionId, opts.submissionId)));
  if (!row || !row.releasedAt) throw new InvalidInput("No such released remark.", [{ path: "remarkId", message: "The remark is not part of this submission's released decisions." }]);
  const [next] = await db
    .select({ id: rounds.id, state: rounds.state })
    .from(rounds)
    .where(and(eq(rounds.submissionId, opts.submissionId), eq(rounds.number, row.roundNumber + 1)));
  if (!next) throw new StateConflict("No revision round is open for this decision.");
  if (next.state !== "draft") throw new StateConflict(`Round ${row.roundNumber + 1} was sent; its answers are frozen.`);
  await db
    .insert(remarkResponses)
    .values({ remarkId: opts.remarkId, roundId: next.id, response: opts.response, authorId: opts.authorId })
    .onConflictDoUpdate({ target: remarkResponses.remarkId, set: { response: opts.response, authorId: opts.authorId, updatedAt: new Date() } });
}
