/**
 * Family I: regime notes from the 2006 scaling study (GJI 166, 97–114), in their
 * convention (gap, E = ν/(ΩD²)): Ro ≈ 0.85·Ra_Q*^0.41, Ra_Q* = Ra*·Nu*,
 * Nu* = (Nu − 1)·E/Pr; dipolar dynamos below a local Rossby number ≈ 0.12.
 * More than policy.regimeFactor off is a note, never more.
 */
import type { RunContext } from "../context.ts";
import { CANONICAL, convert } from "../conventions.ts";
import { flagOf, fmt, type Flag, type RuleInfo } from "../types.ts";

const CA06 = "Geophys. J. Int. 166, 97–114 (2006 scaling study)";

export const RULES_I = {
  rossby: {
    id: "I.rossby-scaling", family: "I", title: "Rossby number far from the flux scaling",
    explanation: "Ro is compared with the fit Ro ≈ 0.85·Ra_Q*^0.41 of dynamo models; far off is worth a look.",
    severities: ["note"], policyKey: "regimeFactor", threshold: "more than policy.regimeFactor (default 3) above or below the fit", source: CA06,
  },
  dipolar: {
    id: "I.dipolar-boundary", family: "I", title: "Field morphology on the unexpected side of Ro_l ≈ 0.12",
    explanation: "Dipolar dynamos are found below a local Rossby number of about 0.12, multipolar ones above.",
    severities: ["note"], policyKey: "localRossbyBoundary",
    threshold: "dipolar (dipolarity > policy.dipolarityThreshold, 0.35 from memory) with Ro_l above boundary × regimeFactor, or multipolar below boundary / regimeFactor",
    source: CA06,
  },
} satisfies Record<string, RuleInfo>;

/** Ra_Q* = Ra*·(Nu − 1)·E/Pr in the 2006 convention. */
export function fluxRayleighStar(raStar: number, nu: number, E: number, Pr: number): number {
  return raStar * (nu - 1) * (E / Pr);
}

export function predictedRossby(raQStar: number): number {
  return 0.85 * Math.pow(raQStar, 0.41);
}

export function checkRegime(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const d = ctx.derived;
  const p = ctx.policy;
  const chi = ctx.run.geometry.radiusRatio;
  const own = ctx.run.conventions;
  const Nu = ctx.given.Nu;
  if (d.RaBuoyancy !== undefined && Nu !== undefined && Nu > 1 && d.Ro !== undefined && d.Pr !== undefined && d.E !== undefined) {
    const raStar = convert("RaBuoyancy", d.RaBuoyancy, own, CANONICAL, chi);
    const E = convert("E", d.E, own, CANONICAL, chi);
    const Ro = convert("Ro", d.Ro, own, CANONICAL, chi);
    const pred = predictedRossby(fluxRayleighStar(raStar, Nu, E, d.Pr));
    const r = Ro / pred;
    if (r > p.regimeFactor || r < 1 / p.regimeFactor) {
      out.push(flagOf(RULES_I.rossby, "note", ["Ro", "RaBuoyancy", "Nu"],
        `${ctx.label}: Ro = ${fmt(Ro)} (gap, Ω) is ${fmt(r > 1 ? r : 1 / r)} times ${r > 1 ? "above" : "below"} the scaling fit 0.85·Ra_Q*^0.41 = ${fmt(pred)}.`,
        { expected: pred, found: Ro, tolerance: `factor ${p.regimeFactor}`, run: ctx.label }));
    }
  }
  const dip = ctx.given.dipolarity ?? ctx.run.diagnostics?.dipolarity;
  if (d.Rol !== undefined && dip !== undefined) {
    const rol = convert("Rol", d.Rol, own, CANONICAL, chi);
    const b = p.localRossbyBoundary;
    const dipolar = dip > p.dipolarityThreshold;
    if ((dipolar && rol > b * p.regimeFactor) || (!dipolar && rol < b / p.regimeFactor)) {
      out.push(flagOf(RULES_I.dipolar, "note", ["Rol", "dipolarity"],
        `${ctx.label}: the field is ${dipolar ? "dipolar" : "multipolar"} (dipolarity ${fmt(dip)}) at Ro_l = ${fmt(rol)}, more than a factor ${p.regimeFactor} ${dipolar ? "above" : "below"} the boundary ${b}.`,
        { expected: dipolar ? `≤ ${fmt(b * p.regimeFactor)}` : `≥ ${fmt(b / p.regimeFactor)}`, found: rol, run: ctx.label }));
    }
  }
  return out;
}
