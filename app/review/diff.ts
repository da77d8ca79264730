/** Round-to-round comparisons, pure so they can be tested and reused on any page. */

export type FlagLite = { fingerprint: string; rule: string; runLabel: string | null; severity: string; message: string };
export type FlagsDiff = { added: FlagLite[]; resolved: FlagLite[]; persisting: FlagLite[] };

/** The same finding in two rounds shares a fingerprint (rule + run + claim lineage + quantities). */
export function diffFlags(before: FlagLite[], after: FlagLite[]): FlagsDiff {
  const was = new Set(before.map((f) => f.fingerprint));
  const now = new Set(after.map((f) => f.fingerprint));
  return {
    added: after.filter((f) => !was.has(f.fingerprint)),
    resolved: before.filter((f) => !now.has(f.fingerprint)),
    persisting: after.filter((f) => was.has(f.fingerprint)),
  };
}

/** Groups one side of a diff by rule, then by run ("(claim)" for flags without a run). */
export function groupByRuleAndRun(list: FlagLite[]) {
  const out = new Map<string, Map<string, FlagLite[]>>();
  for (const f of list) {
    const byRun = out.get(f.rule) ?? new Map<string, FlagLite[]>();
    const run = f.runLabel ?? "(claim)";
    byRun.set(run, [...(byRun.get(run) ?? []), f]);
    out.set(f.rule, byRun);
  }
  return [...out.entries()].sort(([a], [b]) => a.localeCompare(b)).map(([rule, runs]) => ({ rule, runs: [...runs.entries()].map(([run, flags]) => ({ run, flags })) }));
}

export type ParamChange = { path: string; before: unknown; after: unknown };

function flatten(value: unknown, prefix: string, out: Map<string, unknown>) {
  if (value && typeof value === "object" && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
  return out;
}

/** Every dotted path whose value differs between two run records (added, removed or changed). */
export function diffParameters(before: unknown, after: unknown): ParamChange[] {
  const a = flatten(before, "", new Map());
  const b = flatten(after, "", new Map());
  const paths = [...new Set([...a.keys(), ...b.keys()])].sort();
  return paths
    .filter((p) => JSON.stringify(a.get(p)) !== JSON.stringify(b.get(p)))
    .map((p) => ({ path: p, before: a.get(p), after: b.get(p) }));
}
