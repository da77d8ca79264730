/**
 * Family A conventions, exact and reversible.
 *
 * A run declares its length scale L (gap D = r_o − r_i, or outer radius r_o), its
 * rotation factor f (E = ν/(f·Ω·L²)) and its Rayleigh flavour. With Ω' = f·Ω:
 *   classical  Ra   = α g ΔT L³/(ν κ)
 *   rotating   Ra·E/Pr      (2001 community dynamo benchmark, PEPI 128)
 *   buoyancy   Ra·E²/Pr     (Ra* of the 2006 scaling study, Geophys. J. Int. 166, 97–114)
 *   flux       g F/(4π ρ Ω'³ L⁴), F the advected buoyancy flux.
 * For the flux flavour with fixed-temperature boundaries F = α(Nu−1)Q_cond/c_p and
 * Q_cond = 4π k r_i r_o ΔT/D, which gives Ra_F = Ra·E³·(Nu−1)/Pr² · r_i r_o/(L·D);
 * converting it needs the Nusselt number.
 *
 * Every convertible quantity scales as (L_to/L_from)^a · (f_to/f_from)^b.
 * The canonical convention for comparisons is gap, f = 1, classical Ra.
 */

export type LengthScale = "gap" | "outer-radius";
export type RotationFactor = 1 | 2;
export type RayleighFlavour = "classical" | "rotating" | "buoyancy" | "flux";
export type TimeScale = "viscous" | "magnetic" | "thermal" | "rotation";

export interface Frame {
  lengthScale: LengthScale;
  rotationFactor: RotationFactor;
}

export const CANONICAL: Frame = { lengthScale: "gap", rotationFactor: 1 };

/** Exponents (a, b) of L and f for each quantity. */
export const SCALING = {
  E: [-2, -1],
  Ra: [3, 0],
  RaRotating: [1, -1],
  RaBuoyancy: [-1, -2],
  RaFlux: [-4, -3],
  Re: [1, 0],
  Rm: [1, 0],
  Ro: [-1, -1],
  Rol: [0, -1],
  Lo: [-1, -1],
  Lambda: [0, -1],
  kineticEnergy: [2, 0],
  magneticEnergy: [2, 0],
  radius: [-1, 0],
  viscousTime: [-2, 0],
  rotationTime: [0, 1],
  driftFrequency: [2, 0],
  velocity: [1, 0],
  field: [0, -0.5],
} as const satisfies Record<string, readonly [number, number]>;

export type Scaled = keyof typeof SCALING;

/** L in units of the gap D: 1 for gap scaling, 1/(1−χ) for outer-radius scaling. */
export function lengthInGaps(ls: LengthScale, chi: number): number {
  return ls === "gap" ? 1 : 1 / (1 - chi);
}

/** Convert `value` of quantity `q` from one frame to another. */
export function convert(q: Scaled, value: number, from: Frame, to: Frame, chi: number): number {
  const [a, b] = SCALING[q];
  const lr = lengthInGaps(to.lengthScale, chi) / lengthInGaps(from.lengthScale, chi);
  const fr = to.rotationFactor / from.rotationFactor;
  return value * Math.pow(lr, a) * Math.pow(fr, b);
}

/** r_i·r_o/(L·D) in the frame's length unit: χ/(1−χ)² for gap, χ/(1−χ) for outer radius. */
export function fluxGeometryFactor(ls: LengthScale, chi: number): number {
  return ls === "gap" ? chi / (1 - chi) ** 2 : chi / (1 - chi);
}

export interface FlavourContext {
  /** absent when the record neither gives nor implies it: the flavours that need it are unknown */
  E?: number | undefined;
  Pr?: number | undefined;
  /** Nusselt number, needed only for the flux flavour */
  Nu?: number;
  lengthScale: LengthScale;
  chi: number;
}

/** Multiplier m with flavoured = m · classical (same frame); undefined when unknown. */
export function flavourFactor(flavour: RayleighFlavour, c: FlavourContext): number | undefined {
  switch (flavour) {
    case "classical":
      return 1;
    case "rotating":
      return c.E === undefined || c.Pr === undefined ? undefined : c.E / c.Pr;
    case "buoyancy":
      return c.E === undefined || c.Pr === undefined ? undefined : (c.E * c.E) / c.Pr;
    case "flux":
      if (c.E === undefined || c.Pr === undefined) return undefined;
      if (c.Nu === undefined || !(c.Nu > 1)) return undefined;
      return ((c.E ** 3 * (c.Nu - 1)) / (c.Pr * c.Pr)) * fluxGeometryFactor(c.lengthScale, c.chi);
  }
}

export function toClassical(value: number, flavour: RayleighFlavour, c: FlavourContext): number | undefined {
  const m = flavourFactor(flavour, c);
  return m === undefined ? undefined : value / m;
}

export function fromClassical(ra: number, flavour: RayleighFlavour, c: FlavourContext): number | undefined {
  const m = flavourFactor(flavour, c);
  return m === undefined ? undefined : ra * m;
}

/** Radii of the shell in the frame's length unit. */
export function shellRadii(ls: LengthScale, chi: number): { ri: number; ro: number; D: number } {
  if (ls === "gap") return { ri: chi / (1 - chi), ro: 1 / (1 - chi), D: 1 };
  return { ri: chi, ro: 1, D: 1 - chi };
}

/**
 * Duration of one unit of `ts`, in viscous time units L²/ν:
 * viscous 1, magnetic (L²/η) Pm, thermal (L²/κ) Pr, rotation (1/Ω') E.
 */
export function unitInViscous(ts: TimeScale, n: { E?: number; Pr?: number; Pm?: number }): number | undefined {
  switch (ts) {
    case "viscous":
      return 1;
    case "magnetic":
      return n.Pm;
    case "thermal":
      return n.Pr;
    case "rotation":
      return n.E;
  }
}
