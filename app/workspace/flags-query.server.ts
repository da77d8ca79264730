import { asc, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { claims, flags } from "~db/schema";
import { FAMILIES, ruleById } from "~/checker/registry";
import { fmt } from "~/checker/types";

import type { FlagView } from "./view-types";

export type { FlagView };

/** Numbers to four significant figures in the checker's one format (the checker keeps full precision; people read four). */
const show = (v: unknown) => (v === undefined || v === null ? null : typeof v === "number" ? fmt(v) : String(v));

/** A round's stored flags, with the rule's one-line explanation beside each. */
export async function roundFlags(db: Database, roundId: string): Promise<FlagView[]> {
  const rows = await db
    .select({ flag: flags, claimTitle: claims.figure, claimRecord: claims.record })
    .from(flags)
    .leftJoin(claims, eq(claims.id, flags.claimId))
    .where(eq(flags.roundId, roundId))
    // A stable order (fingerprint last) so a list does not reshuffle when it revalidates.
    .orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel), asc(flags.fingerprint), asc(flags.message));
  return rows.map(({ flag: f, claimTitle, claimRecord }) => {
    const info = ruleById(f.rule);
    const d = f.detail as Record<string, unknown>;
    const title = (claimRecord as { title?: string } | null)?.title;
    return {
      id: f.id,
      rule: f.rule,
      ruleTitle: info?.title ?? f.rule,
      family: info?.family ?? f.rule.split(".")[0] ?? "",
      familyTitle: info ? FAMILIES[info.family] : "",
      explanation: info?.explanation ?? "",
      severity: f.severity,
      runLabel: f.runLabel,
      claimId: f.claimId,
      claimTitle: f.claimId ? [claimTitle, title].filter(Boolean).join(": ") || "claim" : null,
      claimRow: typeof d.claimRow === "number" ? d.claimRow : null,
      quantities: f.quantities,
      message: f.message,
      expected: show(d.expected),
      found: show(d.found),
      tolerance: show(d.tolerance),
      source: show(d.source) ?? info?.source ?? "",
      authorAnswer: f.authorAnswer,
    };
  });
}
