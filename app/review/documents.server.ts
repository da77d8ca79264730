import { asc, eq, inArray } from "drizzle-orm";
import { contributors, flags, runChecks } from "~db/schema";
import type { Derived } from "~/checker/types";
import { roundClaims } from "~/workspace/claims.server";
import { roundRunList } from "~/workspace/runs.server";
import type { Db } from "~/workspace/types";
import type { RoundContext } from "./round-context.server";
import { decisionLetterPdf } from "./pdf/letter.server";
import { reviewerPacketPdf } from "./pdf/packet.server";
import { releasedRemarks } from "./remarks.server";
import { contentDisposition } from "~/lib/content-disposition";

export async function roundFlags(db: Db, roundId: string) {
  return db.select().from(flags).where(eq(flags.roundId, roundId)).orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel));
}

/** The packet of a round; a double-blind venue's packet carries no author names. */
export async function packetFor(db: Db, ctx: RoundContext) {
  const [runRows, claimRows, flagRows, people] = await Promise.all([
    roundRunList(db, ctx.round.id),
    roundClaims(db, ctx.round.id),
    roundFlags(db, ctx.round.id),
    // The contributor list as the round was sent; the live list only for a round never sent.
    ctx.round.sentContributors ??
      db.select({ name: contributors.name, affiliation: contributors.affiliation }).from(contributors).where(eq(contributors.submissionId, ctx.submission.id)).orderBy(asc(contributors.position)),
  ]);
  // The recomputed values as the check job stored them per run version: nothing is recomputed here.
  const versionIds = runRows.map((r) => r.versionId);
  const checked = versionIds.length ? await db.select({ id: runChecks.runVersionId, derived: runChecks.derived }).from(runChecks).where(inArray(runChecks.runVersionId, versionIds)) : [];
  const derived = new Map(checked.map((c) => [c.id, c.derived as Derived]));
  const authors = ctx.venue.blinding === "double" || !people.length ? null : people.map((p) => `${p.name}${p.affiliation ? ` (${p.affiliation})` : ""}`).join("; ");
  return reviewerPacketPdf({
    venueName: ctx.venue.name,
    title: ctx.submission.title,
    authors,
    roundNumber: ctx.round.number,
    claims: claimRows.map((c) => ({ figure: c.figure, statement: c.statement, record: c.record })),
    runs: runRows.map((r) => ({ label: r.label, version: r.version, record: r.record, derived: derived.get(r.versionId) })),
    flags: flagRows,
  });
}

/** The decision letter with released remarks, as authors may read it. */
export async function letterFor(db: Db, ctx: RoundContext) {
  const remarks = await releasedRemarks(db, ctx.round);
  return decisionLetterPdf({
    venueName: ctx.venue.name,
    title: ctx.submission.title,
    roundNumber: ctx.round.number,
    decision: ctx.round.decision ?? "",
    decidedAt: ctx.round.decidedAt,
    letter: ctx.round.letter,
    remarks,
  });
}

export function pdfResponse(bytes: Uint8Array, filename: string) {
  return new Response(Buffer.from(bytes), {
    headers: { "content-type": "application/pdf", "content-disposition": contentDisposition("inline", filename), "cache-control": "private, no-store" },
  });
}
