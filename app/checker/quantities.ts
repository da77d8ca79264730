/** Names a claim may state: keys of `derived` (dotted for nested), controls keys, diagnostics keys. */
import type { RunContext } from "./context.ts";
import { fromClassical } from "./conventions.ts";

export { DERIVED_KEYS, DIAGNOSTIC_KEYS, STATABLE, isStatable } from "./quantity-keys.ts";

/**
 * The value a stated quantity is checked against. `Ra` (a controls key) means the
 * Rayleigh number in the run's declared flavour, as configured; `RaRotating`,
 * `RaBuoyancy`, `RaFlux` name a flavour explicitly.
 */
export function lookup(ctx: RunContext, q: string): number | undefined {
  if (q === "Ra") return ctx.run.controls.Ra ?? flavoured(ctx, ctx.derived.Ra);
  const [head, tail] = q.split(".") as [string, string | undefined];
  const d = ctx.derived as Record<string, unknown>;
  if (tail !== undefined) {
    const sub = d[head] as Record<string, number | undefined> | undefined;
    return sub?.[tail];
  }
  const v = d[head];
  if (typeof v === "number") return v;
  const diag = (ctx.run.diagnostics as Record<string, number | undefined> | undefined)?.[q];
  return diag ?? ctx.series?.columns[q]?.mean;
}

/** The value recomputed from material properties, where one exists (family A quantities). */
export function lookupMaterial(ctx: RunContext, q: string): number | undefined {
  const r = ctx.recomputed;
  switch (q) {
    case "E": case "Pr": case "Pm": case "q": case "RaFlux":
      return r[q];
    case "Ra":
      if (r.Ra === undefined) return ctx.run.conventions.rayleigh === "flux" ? r.RaFlux : undefined;
      return flavoured(ctx, r.Ra);
    default:
      return undefined;
  }
}

/** A classical Rayleigh number in the run's declared flavour. */
function flavoured(ctx: RunContext, classical: number | undefined): number | undefined {
  if (classical === undefined) return undefined;
  return fromClassical(classical, ctx.run.conventions.rayleigh, {
    E: ctx.derived.E, Pr: ctx.derived.Pr, lengthScale: ctx.run.conventions.lengthScale, chi: ctx.run.geometry.radiusRatio,
    ...(ctx.given.Nu !== undefined ? { Nu: ctx.given.Nu } : {}),
  });
}
