/**
 * The names a claim may state, with a human name and symbol each. No imports: the claim
 * schema, the checker and the claim editor in the browser all read this one list.
 */

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

/** Name and symbol of each statable quantity, for suggestions in the claim editor. */
export const QUANTITY_NAMES: Record<string, string> = {
  E: "Ekman number E",
  Ra: "Rayleigh number Ra (the run's declared flavour)",
  RaRotating: "rotating Rayleigh number Ra·E/Pr",
  RaBuoyancy: "buoyancy Rayleigh number Ra* = Ra·E²/Pr",
  RaFlux: "flux-based Rayleigh number Ra_F",
  Pr: "Prandtl number Pr",
  Pm: "magnetic Prandtl number Pm",
  q: "Roberts number q = κ/η",
  chi: "radius ratio χ = r_i/r_o",
  Emag_ekman: "magnetic Ekman number E/Pm",
  Re: "Reynolds number Re",
  Rm: "magnetic Reynolds number Rm",
  Ro: "Rossby number Ro",
  Rol: "local Rossby number Ro_l",
  Lo: "Lorentz number Lo",
  Lambda: "Elsasser number Λ",
  NOverOmega: "stratification N/Ω",
  tangentCylinderLatitudeDeg: "tangent-cylinder latitude (°)",
  layerTangentLatitudeDeg: "latitude of the layer's tangent cylinder (°)",
  layerThicknessKm: "layer thickness (km)",
  "runLength.viscous": "run length in viscous times",
  "runLength.magnetic": "run length in magnetic diffusion times",
  "runLength.thermal": "run length in thermal diffusion times",
  "runLength.rotations": "run length in rotations",
  "runLength.overturns": "run length in overturn times",
  "averagingWindow.magnetic": "averaging window in magnetic diffusion times",
  "averagingWindow.overturns": "averaging window in overturn times",
  kineticEnergy: "kinetic energy E_kin",
  magneticEnergy: "magnetic energy E_mag",
  dipolarity: "dipolarity f_dip",
  ohmicFraction: "ohmic dissipation fraction f_ohm",
  Nu: "Nusselt number Nu",
  driftFrequency: "drift frequency ω",
  pointTemperature: "benchmark point value T",
  pointUphi: "benchmark point value u_φ",
  pointBtheta: "benchmark point value B_θ",
};

/** "Elsasser" → "Lambda": a statable key whose name mentions what was typed. */
export function suggestQuantity(typed: string): string | undefined {
  const t = typed.trim().toLowerCase();
  if (t.length < 2) return undefined;
  return STATABLE.find((k) => k.toLowerCase() === t) ?? STATABLE.find((k) => (QUANTITY_NAMES[k] ?? "").toLowerCase().includes(t));
}

/** Top-level keys of the run record that a claim may declare as varied. */
export const VARIABLE_PATHS = [
  "geometry", "conventions", "controls", "controls.E", "controls.Ra", "controls.Pr", "controls.Pm", "material",
  "boundaries", "stableLayer", "stableLayer.edgeRadius", "stableLayer.NOverOmega", "resolution", "time", "diagnostics", "software",
] as const;
