import { and, asc, eq, inArray } from "drizzle-orm";
import { claims, flags, remarkResponses, remarks, reviews } from "~db/schema";
import type { Db } from "~/workspace/types";

/** How an anchor reads to a person: "Figure 3 (claim)", "run strat-B", "flag pm-mismatch on strat-B". */
export async function anchorLabels(db: Db, roundId: string) {
  const [claimRows, flagRows] = await Promise.all([
    db.select({ id: claims.id, figure: claims.figure, statement: claims.statement, lineage: claims.lineage }).from(claims).where(eq(claims.roundId, roundId)),
    db.select({ id: flags.id, rule: flags.rule, runLabel: flags.runLabel, message: flags.message }).from(flags).where(eq(flags.roundId, roundId)),
  ]);
  const claim = new Map(claimRows.map((c) => [c.id, c.figure ? `claim ${c.figure}` : `claim "${c.statement.slice(0, 60)}"`]));
  const flag = new Map(flagRows.map((f) => [f.id, `flag ${f.rule}${f.runLabel ? ` on ${f.runLabel}` : ""}`]));
  return (kind: string, ref: string | null) =>
    kind === "round" ? "the round as a whole" : kind === "run" ? `run ${ref}` : kind === "claim" ? (claim.get(ref ?? "") ?? "a claim") : (flag.get(ref ?? "") ?? "a flag");
}

/**
 * The remarks authors may read: only of a released round, and with the reviewer shown as
 * "Reviewer N". Reviewer ids, names and editor-only notes are never selected here.
 */
export async function releasedRemarks(db: Db, round: { id: string; releasedAt: Date | null }) {
  if (!round.releasedAt) return [];
  const rows = await db
    .select({ id: remarks.id, number: reviews.number, anchorKind: remarks.anchorKind, anchorRef: remarks.anchorRef, body: remarks.body })
    .from(remarks)
    .innerJoin(reviews, eq(reviews.id, remarks.reviewId))
    .where(and(eq(reviews.roundId, round.id), eq(reviews.state, "submitted")))
    .orderBy(asc(reviews.number), asc(remarks.createdAt));
  const label = await anchorLabels(db, round.id);
  return rows.map((r) => ({ id: r.id, reviewer: `Reviewer ${r.number}`, anchor: label(r.anchorKind, r.anchorRef), anchorKind: r.anchorKind, body: r.body }));
}

export async function responsesTo(db: Db, remarkIds: string[]) {
  if (!remarkIds.length) return new Map<string, string>();
  const rows = await db.select({ remarkId: remarkResponses.remarkId, response: remarkResponses.response }).from(remarkResponses).where(inArray(remarkResponses.remarkId, remarkIds));
  return new Map(rows.map((r) => [r.remarkId, r.response]));
}
