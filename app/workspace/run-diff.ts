/**
 * What changed between two versions of a run record, field by field, grouped by the parameter
 * groups of `runproof.run/1` (the run page's version history). Pure; records are small (schema-bound).
 */
import { RUN_GROUPS } from "~/review/pdf/run-record";
import { sig4 } from "~/lib/sig-figs";

export type FieldChange = { path: string; from: string; to: string };
export type GroupChanges = { group: string; changes: FieldChange[] };

/** Leaves of a JSON value as dotted paths ("inner.velocity"); arrays count as one leaf. */
function leaves(v: unknown, prefix: string, out: Map<string, unknown>, depth = 0) {
  if (v !== null && typeof v === "object" && !Array.isArray(v) && depth < 6) {
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) leaves(x, prefix ? `${prefix}.${k}` : k, out, depth + 1);
  } else if (v !== undefined) out.set(prefix, v);
}

const show = (v: unknown) => (v === undefined ? "absent" : typeof v === "number" ? sig4(v) : typeof v === "string" ? v : JSON.stringify(v));

/** Two numbers that read alike at four figures keep their full digits, so a change never looks like none. */
function pair(a: unknown, b: unknown): [string, string] {
  const [x, y] = [show(a), show(b)];
  if (x === y && typeof a === "number" && typeof b === "number") return [String(a), String(b)];
  return [x, y];
}

const TITLES = new Map<string, string>(RUN_GROUPS.map(([k, t]) => [k, t]));

export function diffRunRecords(older: unknown, newer: unknown): GroupChanges[] {
  const a = (older ?? {}) as Record<string, unknown>;
  const b = (newer ?? {}) as Record<string, unknown>;
  const keys = [...RUN_GROUPS.map(([k]) => k as string), ...Object.keys({ ...a, ...b }).filter((k) => !TITLES.has(k) && k !== "format")];
  const out: GroupChanges[] = [];
  for (const key of [...new Set(keys)]) {
    const la = new Map<string, unknown>();
    const lb = new Map<string, unknown>();
    leaves(a[key], "", la);
    leaves(b[key], "", lb);
    const paths = [...new Set([...la.keys(), ...lb.keys()])].sort();
    const changes: FieldChange[] = [];
    for (const path of paths) {
      const x = la.get(path);
      const y = lb.get(path);
      if (JSON.stringify(x) === JSON.stringify(y)) continue;
      const [from, to] = pair(x, y);
      changes.push({ path: path || key, from, to });
    }
    if (changes.length) out.push({ group: TITLES.get(key) ?? key, changes });
  }
  return out;
}
