import { asc, eq } from "drizzle-orm";
import type { Database } from "~db/client";
import { claims, flags } from "~db/schema";
import { FAMILIES, ruleById } from "~/checker/registry";
import { claimTitle, storedFlagFacts } from "./flag-panel.server";
import type { FlagTableData, TableRule } from "./flag-table-shape";

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
    data.rules[f.rule] ??= tableRule(f.rule);
    if (f.claimId && !(f.claimId in data.claims)) data.claims[f.claimId] = claimTitle(figure, claimRecord);
    data.rows.push(storedFlagFacts(f));
  }
  return data;
}
