import { sig4, showValue } from "~/lib/sig-figs";
import type { Derived } from "~/checker/types";

/** The parameter groups of `runproof.run/1`, in the order the contract lists them. */
export const RUN_GROUPS = [
  ["software", "Software"],
  ["geometry", "Geometry"],
  ["conventions", "Conventions"],
  ["controls", "Controls"],
  ["material", "Material (with units)"],
  ["boundaries", "Boundaries"],
  ["stableLayer", "Stable layer"],
  ["resolution", "Resolution"],
  ["time", "Time (in the run's time unit)"],
  ["diagnostics", "Diagnostics"],
  ["benchmark", "Benchmark"],
] as const;

/** Each `derived` value with its symbol, in words. */
export const DERIVED_LABELS: [string, string][] = [
  ["E", "E, Ekman number"],
  ["Ra", "Ra, Rayleigh number (classical)"],
  ["RaRotating", "Ra*, rotating Rayleigh number"],
  ["RaBuoyancy", "Ra_b, buoyancy Rayleigh number"],
  ["RaFlux", "Ra_F, flux Rayleigh number"],
  ["Pr", "Pr, Prandtl number"],
  ["Pm", "Pm, magnetic Prandtl number"],
  ["q", "q, Roberts number"],
  ["chi", "χ, radius ratio"],
  ["Emag_ekman", "E_η, magnetic Ekman number"],
  ["Re", "Re, Reynolds number"],
  ["Rm", "Rm, magnetic Reynolds number"],
  ["Ro", "Ro, Rossby number"],
  ["Rol", "Ro_ℓ, local Rossby number"],
  ["Lo", "Lo, Lorentz number"],
  ["Lambda", "Λ, Elsasser number"],
  ["NOverOmega", "N/Ω, stratification over rotation"],
  ["tangentCylinderLatitudeDeg", "tangent-cylinder latitude (°)"],
  ["layerTangentLatitudeDeg", "latitude where the layer's edge meets the tangent cylinder (°)"],
  ["layerThicknessKm", "layer thickness (km)"],
  ["runLength.viscous", "run length, viscous diffusion times"],
  ["runLength.magnetic", "run length, magnetic diffusion times"],
  ["runLength.thermal", "run length, thermal diffusion times"],
  ["runLength.rotations", "run length, rotations"],
  ["runLength.overturns", "run length, overturn times"],
  ["averagingWindow.magnetic", "averaging window, magnetic diffusion times"],
  ["averagingWindow.overturns", "averaging window, overturn times"],
];

function at(obj: unknown, path: string): unknown {
  return path.split(".").reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), obj);
}

/** "Controls: E = 10⁻⁴, Ra = 2 × 10⁷, …" lines for every group the record holds. */
export function recordLines(record: unknown): { group: string; line: string }[] {
  const r = (record ?? {}) as Record<string, unknown>;
  const out: { group: string; line: string }[] = [];
  for (const [key, title] of RUN_GROUPS) {
    const v = r[key];
    if (v === undefined || v === null) continue;
    if (typeof v !== "object") out.push({ group: title, line: showValue(v) });
    else if (key === "boundaries") {
      for (const [side, b] of Object.entries(v as Record<string, unknown>)) out.push({ group: title, line: `${side}: ${showValue(b)}` });
    } else out.push({ group: title, line: Object.entries(v as Record<string, unknown>).map(([k, x]) => `${k} = ${showValue(x)}`).join(", ") });
  }
  return out;
}

/** Every derived value the checker could recompute, four significant figures. */
export function derivedLines(derived: Derived | undefined): string[] {
  if (!derived) return [];
  return DERIVED_LABELS.flatMap(([key, label]) => {
    const v = at(derived, key);
    return typeof v === "number" && Number.isFinite(v) ? [`${label} = ${sig4(v)}`] : [];
  });
}
