/**
 * The authors' flags panel (round overview, run page, claim page): what its loaders send and what
 * its rows route reads. A round may hold hundreds of flags, so a page carries counts per group and
 * only the rows of groups that are open; the rest are read when someone opens a group.
 */
import type { FlagCounts, FlagGroupSummary, FlagGrouping, FlagQuery } from "~/review/flag-table";

/** Up to this many flags (after the filters) every group starts open, their rows sent with the page. */
export const PANEL_OPEN_ALL_UP_TO = 30;
/** Rows read per step when a closed group is opened ("Show more" reads the next step). */
export const PANEL_ROWS_STEP = 25;
/** The most rows one request reads. */
export const PANEL_ROWS_MAX = 1000;

/** One flag as the panel shows it: the rule's words travel once per rule (`FlagPanelView.rules`). */
export type PanelFlag = {
  id: string;
  rule: string;
  severity: "mismatch" | "caution" | "note";
  runLabel: string | null;
  /** The run form's field the flag concerns (an element id on the run page), if any. */
  field: string | null;
  claimId: string | null;
  /** Which stated value of the claim (0-based), if the flag is about one. */
  claimRow: number | null;
  message: string;
  expected: string | null;
  found: string | null;
  tolerance: string | null;
  /** The flag's own source, when it differs from the rule's. */
  source: string | null;
  authorAnswer: string | null;
};

export type RuleWords = { title: string; explanation: string; source: string };

/** The flags a page limits the panel to: one run's, or one claim's (none: the whole round). */
export type PanelScope = { run?: string; claim?: string };

export type FlagPanelView = {
  scope: PanelScope;
  /** The groupings offered, the default first. */
  groupings: FlagGrouping[];
  query: Pick<FlagQuery, "group" | "severity" | "family">;
  /** Flags in the scope, and how many of them the filters let through. */
  total: number;
  shown: number;
  /** Counts in the scope, filters aside. */
  bySeverity: FlagCounts;
  /** Mismatch flags with no answer from the authors (in the scope, filters aside). */
  unanswered: number;
  families: { id: string; title: string; n: number }[];
  rules: Record<string, RuleWords>;
  /** Titles of the claims the flags name. */
  claims: Record<string, string>;
  groups: FlagGroupSummary[];
  /** Every row the filters let through when there are few (groups then start open); else null. */
  rows: PanelFlag[] | null;
};

export type PanelRows = { rows: PanelFlag[]; total: number };

/** The rows route's search params for one group of a view (the inverse of the schema above). */
export function panelRowsParams(view: Pick<FlagPanelView, "scope" | "query">, key: string, limit: number) {
  const p = new URLSearchParams({ group: view.query.group, key, limit: String(limit) });
  if (view.query.severity) p.set("severity", view.query.severity);
  if (view.query.family) p.set("family", view.query.family);
  if (view.scope.run !== undefined) p.set("run", view.scope.run);
  if (view.scope.claim !== undefined) p.set("claim", view.scope.claim);
  return p;
}
