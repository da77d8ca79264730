/** Names a claim may state: keys of `derived` (dotted for nested), controls keys, diagnostics keys. */
import type { RunContext } from "./context.ts";
import { fromClassical } from "./conventions.ts";

export const DERIVED_KEYS = [
  "E", "Ra", "RaRotating", "RaBuoyancy", "RaFlux", "Pr", "Pm", "q", "chi", "Emag_ekman", "Re", "Rm", "Ro",
  "Rol", "Lo", "Lambda", "NOverOmega", "tangentCylinderLatitudeDeg", "layerTangentLatitudeDeg", "layerThicknessKm",
  "runLength.viscous", "runLength.magnetic", "runLength.thermal", "runLength.rotations", "runLength.overturns",
  "averagingWindow.magnetic", "averagingWindow.overturns",
] as const;

export const DIAGNOSTIC_KEYS = [
  "kineticEnergy", "magneticEnergy", "dipolarity", "ohmicFraction", "Nu",
  "driftFrequency", "pointTemperature", "pointUphi", "pointBtheta",
] as const;

export const STATABLE: readonly string[] = [...DERIVED_KEYS, ...DIAGNOSTIC_KEYS];

export function isStatable(q: string): boolean {
  return STATABLE.includes(q);
}

/**
 * The value a stated quantity is checked against. `Ra` (a controls key) means the
 * Rayleigh number in the run's declared flavour, as configured; `RaRotating`,
 * `RaBuoyancy`, `RaFlux` name a flavour explicitly.
 */
export function lookup(ctx: RunContext, q: string): number | undefined {
  if (q === "Ra") return ctx.run.controls.Ra;
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
    case "Ra": {
      if (r.Ra === undefined) return ctx.run.conventions.rayleigh === "flux" ? r.RaFlux : undefined;
      const c = ctx.run.controls;
      return fromClassical(r.Ra, ctx.run.conventions.rayleigh, {
        E: c.E, Pr: c.Pr, lengthScale: ctx.run.conventions.lengthScale, chi: ctx.run.geometry.radiusRatio,
        ...(ctx.given.Nu !== undefined ? { Nu: ctx.given.Nu } : {}),
      });
    }
    default:
      return undefined;
  }
}
