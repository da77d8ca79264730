/** Family A: control numbers recomputed from material properties under the declared conventions. */
import type { RunContext } from "../context.ts";
import { convert, toClassical, type Frame } from "../conventions.ts";
import { flagOf, fmt, relDiff, relativeTolerance, type Flag, type RuleInfo } from "../types.ts";

const SRC_DEF = "definitions of the control numbers (e.g. Christensen et al. 2001, PEPI 128, 25–34)";
const tol = "relative difference above policy.identityTolerance (default 2 % relative)";

const info = (id: string, title: string, explanation: string, source = SRC_DEF): RuleInfo => ({
  id, family: "A", title, explanation, severities: ["mismatch"], policyKey: "identityTolerance", threshold: tol, source,
});

export const RULES_A = {
  E: info("A.ekman-from-material", "Ekman number from ν, Ω and r_o", "E must equal ν/(f·Ω·L²) with the declared rotation factor f and length scale L."),
  Pr: info("A.pr-from-diffusivities", "Prandtl number from ν and κ", "The configured Prandtl number must equal ν/κ from the material properties."),
  Pm: info("A.pm-from-diffusivities", "Magnetic Prandtl number from ν and η", "The configured magnetic Prandtl number must equal ν/η from the material properties."),
  Ra: info("A.ra-from-material", "Rayleigh number from α, g0, ΔT, ν, κ and r_o", "The configured Rayleigh number, converted from its declared flavour, must equal α·g0·ΔT·L³/(ν·κ)."),
  RaFlux: info(
    "A.raflux-from-material", "Flux Rayleigh number from g0, F, ρ, Ω and r_o",
    "A flux-flavoured Rayleigh number must equal g0·F/(4π·ρ·Ω'³·L⁴).",
    "Geophys. J. Int. 166, 97–114 (2006 scaling study) (flux-based Rayleigh number)",
  ),
  fluxNeedsNu: {
    id: "A.flux-needs-nu", family: "A", title: "Flux Rayleigh number without a Nusselt number",
    explanation: "A flux-based Rayleigh number converts to the other flavours only with the Nusselt number; without it they stay unknown.",
    severities: ["note"], source: "Geophys. J. Int. 166, 97–114 (2006 scaling study)",
  },
} satisfies Record<string, RuleInfo>;

const FRAMES: Frame[] = [
  { lengthScale: "gap", rotationFactor: 1 }, { lengthScale: "gap", rotationFactor: 2 },
  { lengthScale: "outer-radius", rotationFactor: 1 }, { lengthScale: "outer-radius", rotationFactor: 2 },
];

/** "it agrees under lengthScale=…, rotationFactor=…" when another frame would reconcile the values. */
function conventionHint(q: "E" | "Ra", configured: number, recomputed: number, ctx: RunContext): string {
  const own: Frame = ctx.run.conventions;
  const chi = ctx.run.geometry.radiusRatio;
  for (const f of FRAMES) {
    if (f.lengthScale === own.lengthScale && f.rotationFactor === own.rotationFactor) continue;
    if (q === "Ra" && f.rotationFactor !== own.rotationFactor) continue;
    const v = convert(q, recomputed, own, f, chi);
    if (relDiff(configured, v) <= ctx.policy.identityTolerance) {
      return ` It would agree with lengthScale "${f.lengthScale}"${q === "E" ? ` and rotationFactor ${f.rotationFactor}` : ""}: check the declared conventions.`;
    }
  }
  return "";
}

export function checkMaterial(ctx: RunContext): Flag[] {
  const out: Flag[] = [];
  const { run, recomputed: rec, policy } = ctx;
  const c = run.controls;
  const tolerance = policy.identityTolerance;
  const m = `the material properties of ${ctx.label}`;
  const compare = (key: keyof typeof RULES_A & ("E" | "Pr" | "Pm" | "Ra" | "RaFlux"), configured: number | undefined, from: number | undefined, how: string) => {
    if (configured === undefined || from === undefined) return;
    if (relDiff(configured, from) <= tolerance) return;
    const hint = key === "E" || key === "Ra" ? conventionHint(key, configured, from, ctx) : "";
    const what = key === "Ra" && run.conventions.rayleigh !== "classical" && c.Ra !== undefined
      ? `Ra (${run.conventions.rayleigh} ${fmt(c.Ra)}, as classical)`
      : key === "RaFlux" ? "Ra (flux-based)" : key;
    out.push(flagOf(RULES_A[key], "mismatch", [`controls.${key === "RaFlux" ? "Ra" : key}`, "material"],
      `${ctx.label}: configured ${what} = ${fmt(configured)} but ${how} gives ${fmt(from)} (${fmt(100 * relDiff(configured, from))} % off; tolerance ${relativeTolerance(tolerance)}).${hint}`,
      { expected: from, found: configured, tolerance: relativeTolerance(tolerance), run: ctx.label }));
  };
  compare("E", c.E, rec.E, `ν/(${run.conventions.rotationFactor}·Ω·L²) from ${m}`);
  compare("Pr", c.Pr, rec.Pr, `ν/κ from ${m}`);
  compare("Pm", c.Pm, rec.Pm, `ν/η from ${m}`);
  const chi = run.geometry.radiusRatio;
  const fc = { E: ctx.derived.E, Pr: ctx.derived.Pr, lengthScale: run.conventions.lengthScale, chi, ...(ctx.given.Nu !== undefined ? { Nu: ctx.given.Nu } : {}) };
  if (run.conventions.rayleigh === "flux") {
    compare("RaFlux", c.Ra, rec.RaFlux, `g0·F/(4πρΩ'³L⁴) from ${m}`);
    if (ctx.given.Nu === undefined && c.Ra !== undefined) {
      out.push(flagOf(RULES_A.fluxNeedsNu, "note", ["controls.Ra", "Nu"],
        `${ctx.label}: Ra is declared flux-based and no Nusselt number is given (diagnostics.Nu or a series column Nu), so the classical, rotating and buoyancy Rayleigh numbers are unknown.`,
        { run: ctx.label }));
    }
  }
  const classical = c.Ra !== undefined ? toClassical(c.Ra, run.conventions.rayleigh, fc) : undefined;
  compare("Ra", classical, rec.Ra, `α·g0·ΔT·L³/(ν·κ) from ${m}`);
  return out;
}
