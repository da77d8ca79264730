/** Material properties: SI values from the run's strings, and the control numbers they imply. */
import { DIMENSIONS, toSI, UnitError, type Dimension } from "./units.ts";
import type { RunRecord } from "./schema.ts";

export type MaterialKey =
  | "nu" | "kappa" | "eta" | "omega" | "outerRadius" | "alpha" | "gravity" | "deltaT" | "density" | "buoyancyFlux";

export const MATERIAL_DIMENSIONS: Record<MaterialKey, Dimension> = {
  nu: DIMENSIONS.diffusivity,
  kappa: DIMENSIONS.diffusivity,
  eta: DIMENSIONS.diffusivity,
  omega: DIMENSIONS.angularVelocity,
  outerRadius: DIMENSIONS.length,
  alpha: DIMENSIONS.expansivity,
  gravity: DIMENSIONS.acceleration,
  deltaT: DIMENSIONS.temperature,
  density: DIMENSIONS.density,
  buoyancyFlux: DIMENSIONS.massFlux,
};

export type MaterialSI = Partial<Record<MaterialKey, number>>;

export interface PathError {
  path: string;
  message: string;
}

/** Convert every given material string to SI; errors carry their JSON path. */
export function materialToSI(material: RunRecord["material"], prefix: string): { values: MaterialSI; errors: PathError[] } {
  const values: MaterialSI = {};
  const errors: PathError[] = [];
  for (const [k, text] of Object.entries(material ?? {})) {
    const key = k as MaterialKey;
    const path = `${prefix}.${key}`;
    if (typeof text !== "string") continue;
    try {
      const v = toSI(text, MATERIAL_DIMENSIONS[key], path);
      if (!(v > 0)) errors.push({ path, message: `"${text}" for ${path} must be positive` });
      else values[key] = v;
    } catch (e) {
      if (!(e instanceof UnitError)) throw e;
      errors.push({ path, message: e.message });
    }
  }
  return { values, errors };
}

/** Control numbers recomputed from material properties, in the run's own frame. */
export interface Recomputed {
  E?: number;
  Pr?: number;
  Pm?: number;
  q?: number;
  Ra?: number;
  RaFlux?: number;
  /** the length unit L in metres */
  L?: number;
}

export function recompute(m: MaterialSI, run: RunRecord): Recomputed {
  const chi = run.geometry.radiusRatio;
  const f = run.conventions.rotationFactor;
  const out: Recomputed = {};
  const { nu, kappa, eta, omega, outerRadius, alpha, gravity, deltaT, density, buoyancyFlux } = m;
  const L =
    outerRadius === undefined ? undefined : run.conventions.lengthScale === "gap" ? outerRadius * (1 - chi) : outerRadius;
  if (L !== undefined) out.L = L;
  if (nu !== undefined && omega !== undefined && L !== undefined) out.E = nu / (f * omega * L * L);
  if (nu !== undefined && kappa !== undefined) out.Pr = nu / kappa;
  if (nu !== undefined && eta !== undefined) out.Pm = nu / eta;
  if (kappa !== undefined && eta !== undefined) out.q = kappa / eta;
  if (alpha !== undefined && gravity !== undefined && deltaT !== undefined && L !== undefined && nu !== undefined && kappa !== undefined) {
    out.Ra = (alpha * gravity * deltaT * L ** 3) / (nu * kappa);
  }
  if (gravity !== undefined && buoyancyFlux !== undefined && density !== undefined && omega !== undefined && L !== undefined) {
    const w = f * omega;
    out.RaFlux = (gravity * buoyancyFlux) / (4 * Math.PI * density * w ** 3 * L ** 4);
  }
  return out;
}
