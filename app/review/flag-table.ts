/**
 * The flags table's query (grouping and filters, kept in the URL) and its grouping: pure, shared
 * by the reviewer's workspace and the editor's round page, so a link reproduces the same view.
 */

export type FlagGrouping = "claim" | "run";
export const VERDICT_FILTERS = ["none", "agree", "dispute", "ask-authors"] as const;
export type VerdictFilter = (typeof VERDICT_FILTERS)[number];

export type FlagQuery = { group: FlagGrouping; severity: string; family: string; verdict: VerdictFilter | "" };

const SEVERITIES = new Set(["mismatch", "caution", "note"]);

/** Reads the query from search params; anything unknown falls back to "all" rather than failing. */
export function parseFlagQuery(params: URLSearchParams): FlagQuery {
  const group = params.get("group") === "run" ? "run" : "claim";
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
export function withFlagQuery(params: URLSearchParams, query: FlagQuery): URLSearchParams {
  const next = new URLSearchParams(params);
  const set = (key: string, value: string, fallback: string) => (value && value !== fallback ? next.set(key, value) : next.delete(key));
  set("group", query.group, "claim");
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

type Groupable = Filterable & { claimId: string | null; claimTitle: string | null; runLabel: string | null };
export type FlagGroup<T> = { key: string; label: string; flags: T[]; counts: { mismatch: number; caution: number; note: number } };

const SEVERITY_ORDER: Record<string, number> = { mismatch: 0, caution: 1, note: 2 };

/**
 * Groups flags by the claim or the run they concern, in a stable order (groups by label, flags
 * by severity then as given); flags tied to no claim or no single run form the last group.
 */
export function groupFlags<T extends Groupable>(flags: readonly T[], by: FlagGrouping): FlagGroup<T>[] {
  const groups = new Map<string, FlagGroup<T>>();
  for (const f of flags) {
    const key = by === "claim" ? (f.claimId ?? "") : (f.runLabel ?? "");
    const label = by === "claim" ? (f.claimId ? (f.claimTitle ?? "Claim") : "Not tied to a claim") : f.runLabel ? `Run ${f.runLabel}` : "Not tied to one run";
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { key, label, flags: [], counts: { mismatch: 0, caution: 0, note: 0 } }));
    g.flags.push(f);
    if (f.severity in g.counts) g.counts[f.severity as keyof FlagGroup<T>["counts"]] += 1;
  }
  const list = [...groups.values()];
  for (const g of list) g.flags.sort((a, b) => (SEVERITY_ORDER[a.severity] ?? 3) - (SEVERITY_ORDER[b.severity] ?? 3));
  return list.sort((a, b) => (a.key === "" ? 1 : b.key === "" ? -1 : a.label.localeCompare(b.label, "en", { numeric: true })));
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
