/**
 * Family C: diagnostic identities in the run's own conventions.
 * Rm = Re·Pm; Ro = Re·E; Rm = Ro·Pm/E; Λ = Lo²·Pm/E; in viscous units with B scaled by
 * √(ρμ0ηΩ) (the 2001 benchmark's units): Re = √(2·E_kin), Λ = 2·E·Pm·E_mag, energies per
 * unit volume. For another time unit τ, velocities scale by (τ in viscous units), so
 * Re = √(2·E_kin)/(τ/t_visc); the Λ–E_mag identity is only applied in viscous units.
 * Only values given by the author (diagnostics or series means) are compared.
 */
import type { RunContext } from "../context.ts";
import { velocityToRe } from "../derive.ts";
import { flagOf, fmt, relDiff, relativeTolerance, type Flag, type RuleInfo } from "../types.ts";

const SRC = "definitions of the diagnostic numbers; Christensen et al. 2001, PEPI 128, 25–34 (energy scaling)";
const threshold = "relative difference above policy.identityTolerance (default 2 % relative)";
const info = (id: string, title: string, explanation: string): RuleInfo => ({
  id, family: "C", title, explanation, severities: ["mismatch"], policyKey: "identityTolerance", threshold, source: SRC,
});

export const RULES_C = {
  rmRePm: info("C.rm-re-pm", "Rm = Re·Pm", "The magnetic Reynolds number must equal the Reynolds number times Pm."),
  roReE: info("C.ro-re-e", "Ro = Re·E", "The Rossby number must equal the Reynolds number times E."),
  rmRoPmE: info("C.rm-ro-pm-e", "Rm = Ro·Pm/E", "The magnetic Reynolds number must equal Ro·Pm/E."),
  lambdaLo: info("C.lambda-lo-pm-e", "Λ = Lo²·Pm/E", "The Elsasser number must equal Lo²·Pm/E."),
  reEkin: info("C.re-kinetic-energy", "Re = √(2·E_kin)", "In viscous units the Reynolds number is the rms velocity, √(2·E_kin) with E_kin per unit volume."),
  lambdaEmag: info("C.lambda-magnetic-energy", "Λ = 2·E·Pm·E_mag", "With B in √(ρμ0ηΩ) and E_mag = ∫B²dV/(2V·E·Pm), the Elsasser number is 2·E·Pm·E_mag."),
} satisfies Record<string, RuleInfo>;

export function checkIdentities(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const g = ctx.given;
  const E = ctx.derived.E;
  const Pm = ctx.derived.Pm;
  const tolerance = ctx.policy.identityTolerance;
  const test = (r: RuleInfo, name: string, found: number | undefined, expected: number | undefined, how: string, qs: string[]) => {
    if (found === undefined || expected === undefined || !Number.isFinite(expected)) return;
    if (relDiff(found, expected) <= tolerance) return;
    out.push(flagOf(r, "mismatch", qs,
      `${ctx.label}: ${name} = ${fmt(found)} but ${how} = ${fmt(expected)} (${fmt(100 * relDiff(found, expected))} % off; tolerance ${relativeTolerance(tolerance)}).`,
      { expected, found, tolerance: relativeTolerance(tolerance), run: ctx.label }));
  };
  if (Pm !== undefined && E !== undefined) {
    test(RULES_C.rmRePm, "Rm", g.Rm, g.Re !== undefined ? g.Re * Pm : undefined, `Re·Pm = ${fmt(g.Re ?? NaN)}·${fmt(Pm)}`, ["Rm", "Re", "Pm"]);
    test(RULES_C.rmRoPmE, "Rm", g.Rm, g.Ro !== undefined ? (g.Ro * Pm) / E : undefined, "Ro·Pm/E", ["Rm", "Ro", "Pm", "E"]);
    test(RULES_C.lambdaLo, "Λ", g.Lambda, g.Lo !== undefined ? (g.Lo * g.Lo * Pm) / E : undefined, "Lo²·Pm/E", ["Lambda", "Lo", "Pm", "E"]);
    if (ctx.run.conventions.timeScale === "viscous") {
      test(RULES_C.lambdaEmag, "Λ", g.Lambda, g.magneticEnergy !== undefined ? 2 * E * Pm * g.magneticEnergy : undefined,
        "2·E·Pm·E_mag", ["Lambda", "magneticEnergy", "E", "Pm"]);
    }
  } else if (Pm !== undefined) {
    test(RULES_C.rmRePm, "Rm", g.Rm, g.Re !== undefined ? g.Re * Pm : undefined, `Re·Pm = ${fmt(g.Re ?? NaN)}·${fmt(Pm)}`, ["Rm", "Re", "Pm"]);
  }
  if (E !== undefined) test(RULES_C.roReE, "Ro", g.Ro, g.Re !== undefined ? g.Re * E : undefined, "Re·E", ["Ro", "Re", "E"]);
  const k = velocityToRe(ctx.run, ctx.derived);
  test(RULES_C.reEkin, "Re", g.Re, g.kineticEnergy !== undefined && k !== undefined ? Math.sqrt(2 * g.kineticEnergy) * k : undefined,
    ctx.run.conventions.timeScale === "viscous" ? "√(2·E_kin)" : `√(2·E_kin) converted from ${ctx.run.conventions.timeScale} units`,
    ["Re", "kineticEnergy"]);
  return out;
}
