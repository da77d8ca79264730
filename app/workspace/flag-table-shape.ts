/**
 * The reviewers' and the editor's flags table: what its rows route sends and how the table turns it
 * back into one `FlagView` per flag. The rule's words and the claim's title travel once (a round of
 * 300 flags names some 30 rules and 40 claims), and the rows come after the page, not inside it.
 */
import type { FlagView } from "./view-types";

/** One flag as sent: the words of its rule and the title of its claim are in the dictionaries beside it. */
export type TableFlag = Pick<FlagView, "id" | "rule" | "severity" | "runLabel" | "claimId" | "claimRow" | "message" | "expected" | "found" | "tolerance" | "authorAnswer"> & {
  /** The flag's own source, when it differs from the rule's. */
  source: string | null;
};

export type TableRule = { title: string; family: string; familyTitle: string; explanation: string; source: string };

export type FlagTableData = { rows: TableFlag[]; rules: Record<string, TableRule>; claims: Record<string, string> };

/** The table's flags in full, in the order sent. */
export function expandFlagTable(data: FlagTableData): FlagView[] {
  return data.rows.map((f) => {
    const rule = data.rules[f.rule];
    return {
      ...f,
      ruleTitle: rule?.title ?? f.rule,
      family: rule?.family ?? f.rule.split(".")[0] ?? "",
      familyTitle: rule?.familyTitle ?? "",
      explanation: rule?.explanation ?? "",
      source: f.source ?? rule?.source ?? "",
      claimTitle: f.claimId ? (data.claims[f.claimId] ?? "claim") : null,
    };
  });
}
