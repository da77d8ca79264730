/**
 * Family G: the runs of a claim may differ only in the run-record paths the claim
 * declares as varied. Controls are compared after normalising to the canonical
 * convention (gap, f = 1, classical Ra); material properties as SI numbers.
 */
import type { ClaimContext, RunContext } from "../context.ts";
import { CANONICAL, convert } from "../conventions.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const CP = "common practice";

export const RULES_G = {
  undeclared: {
    id: "G.undeclared-difference", family: "G", title: "Compared runs differ in an undeclared parameter",
    explanation: "Runs of one comparison must differ only in the parameters the claim declares as varied.",
    severities: ["mismatch"], source: CP,
  },
  resolution: {
    id: "G.resolution-difference", family: "G", title: "Compared runs differ in resolution",
    explanation: "A resolution difference between compared runs is not a physical change but can affect the comparison.",
    severities: ["caution"], source: CP,
  },
  unchanged: {
    id: "G.varied-unchanged", family: "G", title: "Declared varied parameter is the same in all runs",
    explanation: "A parameter the claim says it varies should differ between its runs.",
    severities: ["caution"], source: CP,
  },
  missing: {
    id: "G.claim-run-missing", family: "G", title: "Claim names a run that was not supplied",
    explanation: "Every run label of a claim must belong to a supplied run record.",
    severities: ["mismatch"], source: CP,
  },
} satisfies Record<string, RuleInfo>;

type Leaf = string | number | boolean;

function flatten(prefix: string, v: unknown, out: Map<string, Leaf>): void {
  if (v === undefined || v === null) return;
  if (typeof v === "object" && !Array.isArray(v)) {
    for (const [k, x] of Object.entries(v)) flatten(`${prefix}.${k}`, x, out);
  } else out.set(prefix, v as Leaf);
}

export function comparable(ctx: RunContext): Map<string, Leaf> {
  const r = ctx.run;
  const chi = r.geometry.radiusRatio;
  const out = new Map<string, Leaf>();
  flatten("geometry", r.geometry, out);
  flatten("conventions", r.conventions, out);
  const d = ctx.derived;
  if (d.E !== undefined) out.set("controls.E", convert("E", d.E, r.conventions, CANONICAL, chi));
  const ra = ctx.derived.Ra;
  if (ra !== undefined) out.set("controls.Ra", convert("Ra", ra, r.conventions, CANONICAL, chi));
  else if (r.controls.Ra !== undefined) out.set("controls.Ra", `${r.controls.Ra} (${r.conventions.rayleigh})`);
  if (d.Pr !== undefined) out.set("controls.Pr", d.Pr);
  if (d.Pm !== undefined) out.set("controls.Pm", d.Pm);
  flatten("boundaries", r.boundaries, out);
  flatten("stableLayer", r.stableLayer, out);
  flatten("material", ctx.material, out);
  flatten("resolution", r.resolution, out);
  return out;
}

function same(a: Leaf | undefined, b: Leaf | undefined): boolean {
  if (typeof a === "number" && typeof b === "number") return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
  return a === b;
}

export const covers = (varied: string, path: string) => path === varied || path.startsWith(varied + ".");

const show = (v: Leaf | undefined) => (v === undefined ? "absent" : typeof v === "string" ? `"${v}"` : typeof v === "number" ? fmt(v) : String(v));

export function checkComparison(cc: ClaimContext): Flag[] {
  const out: Flag[] = [];
  const present: RunContext[] = [];
  for (const r of cc.claim.runs) {
    const ctx = cc.runs.get(r.label);
    if (ctx) present.push(ctx);
    else out.push(flagOf(RULES_G.missing, "mismatch", ["runs"], `The claim names run "${r.label}", which was not supplied.`, { run: r.label }));
  }
  if (present.length < 2) return out;
  const varies = cc.claim.varies ?? [];
  const refLabel = cc.claim.runs.find((r) => r.part === "reference" && cc.runs.has(r.label))?.label;
  const base = present.find((c) => c.label === refLabel) ?? (present[0] as RunContext);
  const a = comparable(base);
  const changed = new Set<string>();
  for (const other of present) {
    if (other === base) continue;
    const b = comparable(other);
    for (const path of new Set([...a.keys(), ...b.keys()])) {
      if (same(a.get(path), b.get(path))) continue;
      // Material properties are optional documentation of the controls: one run stating them and
      // the other not is no physical difference (the controls are compared above); two stated values are.
      if (path.startsWith("material.") && (a.get(path) === undefined || b.get(path) === undefined)) continue;
      changed.add(path);
      if (varies.some((v) => covers(v, path))) continue;
      const resolution = path.startsWith("resolution.");
      const rule = resolution ? RULES_G.resolution : RULES_G.undeclared;
      out.push(flagOf(rule, resolution ? "caution" : "mismatch", [path],
        `Runs "${base.label}" and "${other.label}" differ in ${path} (${show(a.get(path))} vs ${show(b.get(path))}), which the claim does not declare as varied.`,
        { expected: show(a.get(path)), found: show(b.get(path)), run: other.label }));
    }
  }
  for (const v of varies) {
    if (![...changed].some((p) => covers(v, p))) {
      out.push(flagOf(RULES_G.unchanged, "caution", [v], `The claim declares ${v} as varied, but it is the same in all its runs.`));
    }
  }
  return out;
}
