/**
 * Geometry (family H): tangent-cylinder latitude arccos(r_i/r_o) and the stable
 * layer's arccos(edge/r_o); layer thickness in km for a reference body, by scaling the
 * run's fraction of r_o with the body's outer radius (material.outerRadius when given,
 * otherwise the policy's body, default Earth's core from PREM).
 */
import { shellRadii } from "./conventions.ts";
import type { ReferenceBody } from "./reference.ts";
import type { RunRecord } from "./schema.ts";

const DEG = 180 / Math.PI;

export interface LayerGeometry {
  tangentCylinderLatitudeDeg: number;
  layerTangentLatitudeDeg?: number;
  layerThicknessKm?: number;
  /** edge radius as a fraction of r_o */
  edgeOverRo?: number;
  edgeInside?: boolean;
  outerRadiusKm: number;
}

export function tangentLatitudeDeg(rOverRo: number): number {
  return Math.acos(rOverRo) * DEG;
}

export function layerGeometry(run: RunRecord, body: ReferenceBody, outerRadiusM?: number): LayerGeometry {
  const chi = run.geometry.radiusRatio;
  const outerRadiusKm = outerRadiusM !== undefined ? outerRadiusM / 1000 : body.outerRadiusKm;
  const out: LayerGeometry = { tangentCylinderLatitudeDeg: tangentLatitudeDeg(chi), outerRadiusKm };
  const layer = run.stableLayer;
  if (!layer) return out;
  const { ri, ro } = shellRadii(run.conventions.lengthScale, chi);
  const x = layer.edgeRadius / ro;
  out.edgeOverRo = x;
  out.edgeInside = layer.edgeRadius > ri && layer.edgeRadius < ro;
  if (!out.edgeInside) return out;
  out.layerTangentLatitudeDeg = tangentLatitudeDeg(x);
  const fraction = layer.position === "top" ? 1 - x : x - chi;
  out.layerThicknessKm = fraction * outerRadiusKm;
  return out;
}
