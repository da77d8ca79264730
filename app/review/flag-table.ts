/**
 * The flags table's query (grouping and filters, kept in the URL) and its grouping: pure, shared
 * by the reviewer's workspace and the editor's round page, so a link reproduces the same view.
 */

export type FlagGrouping = "claim" | "run" | "rule";
/** The groupings the reviewer's and the editor's table offer (the first is the default). */
export const TABLE_GROUPINGS: readonly FlagGrouping[] = ["claim", "run"];
export const VERDICT_FILTERS = ["none", "agree", "dispute", "ask-authors"] as const;
export type VerdictFilter = (typeof VERDICT_FILTERS)[number];

export type FlagQuery = { group: FlagGrouping; severity: string; family: string; verdict: VerdictFilter | "" };

const SEVERITIES = new Set(["mismatch", "caution", "note"]);

/**
 * Reads the query from search params; anything unknown falls back to "all" rather than failing.
 * `groupings` are the ones the view offers, its default first.
 */
export function parseFlagQuery(params: URLSearchParams, groupings: readonly FlagGrouping[] = TABLE_GROUPINGS): FlagQuery {
  const asked = params.get("group");
  const group = groupings.find((g) => g === asked) ?? groupings[0] ?? "claim";
  const severity = params.get("severity") ?? "";
  const family = params.get("family") ?? "";
  const verdict = params.get("verdict") ?? "";
  return {
    group,
    severity: SEVERITIES.has(severity) ? severity : "",
    family: /^[A-Z]$/.test(family) ? family : "",
    verdict: (VERDICT_FILTERS as readonly string[]).includes(verdict) ? (verdict as VerdictFilter) : "",
  };
}

/** The search params of a query, leaving out defaults so URLs stay short; other params are kept. */
export function withFlagQuery(params: URLSearchParams, query: FlagQuery, defaultGroup: FlagGrouping = TABLE_GROUPINGS[0]!): URLSearchParams {
  const next = new URLSearchParams(params);
  const set = (key: string, value: string, fallback: string) => (value && value !== fallback ? next.set(key, value) : next.delete(key));
  set("group", query.group, defaultGroup);
  set("severity", query.severity, "");
  set("family", query.family, "");
  set("verdict", query.verdict, "");
  return next;
}

type Filterable = { id: string; severity: string; family: string };

/**
 * The flags the query lets through. `verdictsOf(id)` lists the verdicts given on a flag (the
 * reviewer's own, or every reviewer's for the editor): "none" keeps flags nobody judged yet.
 */
export function filterFlags<T extends Filterable>(flags: readonly T[], query: FlagQuery, verdictsOf: (id: string) => readonly string[]): T[] {
  return flags.filter((f) => {
    if (query.severity && f.severity !== query.severity) return false;
    if (query.family && f.family !== query.family) return false;
    if (query.verdict) {
      const given = verdictsOf(f.id);
      if (query.verdict === "none" ? given.length > 0 : !given.includes(query.verdict)) return false;
    }
    return true;
  });
}

type Groupable = { severity: string; claimId: string | null; claimTitle: string | null; runLabel: string | null; rule?: string; ruleTitle?: string };
export type FlagCounts = { mismatch: number; caution: number; note: number };
export type FlagGroup<T> = { key: string; label: string; flags: T[]; counts: FlagCounts };
/** A group known by its counts only (its flags are read when it is opened). */
export type FlagGroupSummary = { key: string; label: string; total: number; counts: FlagCounts };

const SEVERITY_ORDER: Record<string, number> = { mismatch: 0, caution: 1, note: 2 };

/** The key of the group a flag belongs to: its claim, its run or its rule; "" for flags tied to no claim or no single run. */
export function groupKeyOf(f: Pick<Groupable, "claimId" | "runLabel" | "rule">, by: FlagGrouping): string {
  return (by === "rule" ? f.rule : by === "claim" ? f.claimId : f.runLabel) ?? "";
}

function groupOf(f: Groupable, by: FlagGrouping): { key: string; label: string } {
  const key = groupKeyOf(f, by);
  if (by === "rule") return { key, label: f.ruleTitle ?? f.rule ?? "Rule" };
  if (by === "claim") return { key, label: key ? (f.claimTitle ?? "Claim") : "Not tied to a claim" };
  return { key, label: key ? `Run ${key}` : "Not tied to one run" };
}

/** Groups by label in natural order ("Fig. 3" before "Fig. 10"), the group of unattached flags last. */
function sortGroups<G extends { key: string; label: string }>(list: G[]): G[] {
  return list.sort((a, b) => (a.key === "" ? 1 : b.key === "" ? -1 : a.label.localeCompare(b.label, "en", { numeric: true })));
}

function addCount(counts: FlagCounts, severity: string, n: number) {
  if (severity in counts) counts[severity as keyof FlagCounts] += n;
}

/**
 * Groups flags by the claim, the run or the rule they concern, in a stable order (groups by label,
 * flags by severity then as given); flags tied to no claim or no single run form the last group.
 */
export function groupFlags<T extends Groupable>(flags: readonly T[], by: FlagGrouping): FlagGroup<T>[] {
  const groups = new Map<string, FlagGroup<T>>();
  for (const f of flags) {
    const { key, label } = groupOf(f, by);
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { key, label, flags: [], counts: { mismatch: 0, caution: 0, note: 0 } }));
    g.flags.push(f);
    addCount(g.counts, f.severity, 1);
  }
  const list = [...groups.values()];
  for (const g of list) g.flags.sort((a, b) => (SEVERITY_ORDER[a.severity] ?? 3) - (SEVERITY_ORDER[b.severity] ?? 3));
  return sortGroups(list);
}

/** The same groups as `groupFlags`, from counted rows (`n` flags alike in severity, rule, run and claim). */
export function summariseGroups(rows: readonly (Groupable & { n: number })[], by: FlagGrouping): FlagGroupSummary[] {
  const groups = new Map<string, FlagGroupSummary>();
  for (const r of rows) {
    const { key, label } = groupOf(r, by);
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { key, label, total: 0, counts: { mismatch: 0, caution: 0, note: 0 } }));
    g.total += r.n;
    addCount(g.counts, r.severity, r.n);
  }
  return sortGroups([...groups.values()]);
}

const QUERY_KEYS = ["group", "severity", "family", "verdict"];

/** True when two addresses differ only in the flags' grouping or filters (no data to reload). */
export function onlyFlagQueryChanged(a: URL, b: URL) {
  if (a.pathname !== b.pathname) return false;
  const strip = (u: URL) => {
    const p = new URLSearchParams(u.search);
    for (const k of QUERY_KEYS) p.delete(k);
    p.sort();
    return p.toString();
  };
  return strip(a) === strip(b) && a.search !== b.search;
}
