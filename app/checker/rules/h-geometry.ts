/** Family H: tangent cylinder, stable-layer edge and thickness for a reference body. */
import type { RunContext } from "../context.ts";
import { shellRadii } from "../conventions.ts";
import { layerGeometry } from "../geometry.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const PREM = "PREM, Dziewonski & Anderson 1981, Phys. Earth Planet. Inter. 25, 297–356";

export const RULES_H = {
  edge: {
    id: "H.layer-edge-outside", family: "H", title: "Stable layer edge outside the shell",
    explanation: "stableLayer.edgeRadius, in the run's length unit, must lie between r_i and r_o.",
    severities: ["mismatch"], source: "spherical-shell geometry",
  },
  body: {
    id: "H.reference-body-ratio", family: "H", title: "Run's radius ratio differs from the reference body's",
    explanation: "The layer thickness in km scales the run with the reference body's outer radius; a different r_i/r_o makes it approximate.",
    severities: ["note"], policyKey: "referenceBody",
    threshold: "relative difference above policy.identityTolerance between χ and the body's r_i/r_o (default Earth 1221.5/3480 km)", source: PREM,
  },
  stated: {
    id: "H.stated-geometry", family: "H", title: "Stated latitude or layer thickness differs",
    explanation: "A stated tangent-cylinder latitude arccos(r_i/r_o), layer latitude arccos(edge/r_o) or layer thickness in km must agree within its stated precision.",
    severities: ["mismatch"], policyKey: "referenceBody", threshold: "outside the stated value's interval", source: PREM,
  },
} satisfies Record<string, RuleInfo>;

export function checkGeometry(ctx: RunContext): Flag[] {
  const layer = ctx.run.stableLayer;
  if (!layer) return [];
  const out: Flag[] = [];
  const chi = ctx.run.geometry.radiusRatio;
  const ls = ctx.run.conventions.lengthScale;
  const { ri, ro } = shellRadii(ls, chi);
  const geo = layerGeometry(ctx.run, ctx.policy.referenceBody, ctx.material.outerRadius);
  if (!geo.edgeInside) {
    const hint = ls === "gap" && layer.edgeRadius <= 1 && layer.edgeRadius / (1 - chi) > ri
      ? ` If it was meant as a fraction of r_o, in gap units it is ${fmt(layer.edgeRadius / (1 - chi))}.`
      : "";
    out.push(flagOf(RULES_H.edge, "mismatch", ["stableLayer.edgeRadius"],
      `${ctx.label}: edgeRadius ${fmt(layer.edgeRadius)} is outside the shell ${fmt(ri)} < r < ${fmt(ro)} (${ls} length unit, χ = ${chi}).${hint}`,
      { expected: `${fmt(ri)}…${fmt(ro)}`, found: layer.edgeRadius, run: ctx.label }));
  }
  const body = ctx.policy.referenceBody;
  if (ctx.material.outerRadius === undefined) {
    const bodyChi = body.innerRadiusKm / body.outerRadiusKm;
    if (Math.abs(chi - bodyChi) / bodyChi > ctx.policy.identityTolerance) {
      out.push(flagOf(RULES_H.body, "note", ["chi", "layerThicknessKm"],
        `${ctx.label}: layerThicknessKm scales the run to ${body.name} (r_o = ${body.outerRadiusKm} km), whose r_i/r_o = ${fmt(bodyChi)} differs from χ = ${chi}.`,
        { expected: bodyChi, found: chi, run: ctx.label }));
    }
  }
  return out;
}
