import { asc, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { claims, flags } from "~db/schema";
import { FAMILIES, ruleById } from "~/checker/registry";
import { fmt } from "~/checker/types";
import { claimTitle } from "./flag-panel.server";
import type { FlagTableData, TableRule } from "./flag-table-shape";

/** Numbers to four significant figures in the checker's one format (the checker keeps full precision; people read four). */
const show = (v: unknown) => (v === undefined || v === null ? null : typeof v === "number" ? fmt(v) : String(v));

function tableRule(rule: string): TableRule {
  const info = ruleById(rule);
  return {
    title: info?.title ?? rule,
    family: info?.family ?? rule.split(".")[0] ?? "",
    familyTitle: info ? FAMILIES[info.family] : "",
    explanation: info?.explanation ?? "",
    source: info?.source ?? "",
  };
}

/** A round's stored flags for the reviewers' and the editor's table, with each rule's words and each claim's title once. */
export async function roundFlagTable(db: Database, roundId: string): Promise<FlagTableData> {
  const found = await db
    .select({ flag: flags, figure: claims.figure, claimRecord: claims.record })
    .from(flags)
    .leftJoin(claims, eq(claims.id, flags.claimId))
    .where(eq(flags.roundId, roundId))
    // A stable order (fingerprint last) so a list does not reshuffle when it is read again.
    .orderBy(asc(flags.severity), asc(flags.rule), asc(flags.runLabel), asc(flags.fingerprint), asc(flags.message));
  const data: FlagTableData = { rows: [], rules: {}, claims: {} };
  for (const { flag: f, figure, claimRecord } of found) {
    const rule = (data.rules[f.rule] ??= tableRule(f.rule));
    if (f.claimId && !(f.claimId in data.claims)) data.claims[f.claimId] = claimTitle(figure, claimRecord);
    const d = f.detail as Record<string, unknown>;
    const source = show(d.source);
    data.rows.push({
      id: f.id,
      rule: f.rule,
      severity: f.severity,
      runLabel: f.runLabel,
      claimId: f.claimId,
      claimRow: typeof d.claimRow === "number" ? d.claimRow : null,
      message: f.message,
      expected: show(d.expected),
      found: show(d.found),
      tolerance: show(d.tolerance),
      source: source && source !== rule.source ? source : null,
      authorAnswer: f.authorAnswer,
    });
  }
  return data;
}
