import { and, eq, sql } from "drizzle-orm";
import { claims, flags } from "~db/schema";
import type { Db } from "~/workspace/types";

export const ADVISORY =
  "Flags are advisory: computed from what the authors entered, under the conventions they declared; the reviewer's judgement decides.";

type FlagRow = typeof flags.$inferSelect;

/** A stored flag as the API shows it; who answered it is not part of the response. */
export function flagOut(f: FlagRow) {
  return {
    id: f.id,
    rule: f.rule,
    severity: f.severity,
    run: f.runLabel,
    claimId: f.claimId,
    quantities: f.quantities,
    message: f.message,
    detail: f.detail,
    authorAnswer: f.authorAnswer,
  };
}

export type FlagCounts = { mismatch: number; caution: number; note: number };
export const noFlags = (): FlagCounts => ({ mismatch: 0, caution: 0, note: 0 });

/** Flag counts of a round, per run label ("" for the round as a whole). */
export async function flagCountsByRun(db: Db, roundId: string) {
  const rows = await db
    .select({ run: flags.runLabel, severity: flags.severity, n: sql<number>`count(*)::int` })
    .from(flags)
    .where(eq(flags.roundId, roundId))
    .groupBy(flags.runLabel, flags.severity);
  const total = noFlags();
  const byRun = new Map<string, FlagCounts>();
  for (const r of rows) {
    total[r.severity] += r.n;
    if (r.run) {
      const c = byRun.get(r.run) ?? noFlags();
      c[r.severity] += r.n;
      byRun.set(r.run, c);
    }
  }
  return { total, byRun };
}

export async function runFlags(db: Db, roundId: string, label: string) {
  const rows = await db.select().from(flags).where(and(eq(flags.roundId, roundId), eq(flags.runLabel, label)));
  return rows.map(flagOut);
}

export const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function claimOut(c: typeof claims.$inferSelect) {
  return { id: c.id, position: c.position, figure: c.figure, statement: c.statement, record: c.record, version: c.version, updatedAt: c.updatedAt.toISOString() };
}
