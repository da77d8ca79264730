/**
 * Dimensional inputs: strings such as "0.8 m^2/s" parsed with mathjs and converted
 * to SI numbers, with an error naming the dimension found and the one expected.
 */
import { unit, magneticConstant, type Unit } from "mathjs";

export interface Dimension {
  name: string;
  /** SI unit used for conversion, in mathjs syntax */
  si: string;
  /** unit shown to people */
  shown: string;
}

export const DIMENSIONS = {
  diffusivity: { name: "diffusivity", si: "m^2 s^-1", shown: "m^2/s" },
  angularVelocity: { name: "angular velocity", si: "rad s^-1", shown: "rad/s" },
  length: { name: "length", si: "m", shown: "m" },
  expansivity: { name: "thermal expansivity", si: "K^-1", shown: "1/K" },
  acceleration: { name: "acceleration", si: "m s^-2", shown: "m/s^2" },
  temperature: { name: "temperature difference", si: "K", shown: "K" },
  density: { name: "density", si: "kg m^-3", shown: "kg/m^3" },
  massFlux: { name: "mass flux", si: "kg s^-1", shown: "kg/s" },
  time: { name: "time", si: "s", shown: "s" },
  velocity: { name: "velocity", si: "m s^-1", shown: "m/s" },
  frequency: { name: "frequency", si: "s^-1", shown: "1/s" },
  mass: { name: "mass", si: "kg", shown: "kg" },
  magneticField: { name: "magnetic field", si: "T", shown: "T" },
} as const satisfies Record<string, Dimension>;

export class UnitError extends Error {}

const SUPERSCRIPTS: Record<string, string> = {
  "⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7", "⁸": "8", "⁹": "9", "⁻": "-",
};

/** Normalise unicode and number syntax: "1×10⁻⁶ m²·s⁻¹" → "1e-6 m^2 s^-1". */
export function normaliseUnitText(text: string): string {
  let s = text.trim().replace(/\u2212/g, "-");
  s = s.replace(/[⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+/g, (m) => "^" + [...m].map((c) => SUPERSCRIPTS[c] ?? c).join(""));
  s = s.replace(/\s*[×x*·]\s*10\s*\^\s*\(?([+-]?\d+)\)?/, "e$1");
  return s.replace(/·/g, " ");
}

const NUMBER = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/;

function parseUnit(text: string): Unit {
  const s = normaliseUnitText(text);
  const m = NUMBER.exec(s);
  if (!m) throw new UnitError(`"${text}" does not start with a number`);
  const value = Number(m[1]);
  let u = (m[2] ?? "").trim();
  if (u === "") throw new UnitError(`"${text}" has no unit`);
  if (u.startsWith("1/")) u = u.slice(2).trim() + "^-1";
  try {
    return unit(value, u);
  } catch (e) {
    throw new UnitError(`"${text}": ${(e as Error).message}`);
  }
}

function describeDimension(u: Unit): string {
  for (const d of Object.values(DIMENSIONS)) {
    if (u.equalBase(unit(d.si))) return `a ${d.name}`;
  }
  return `in units of ${u.formatUnits() || "1 (dimensionless)"}`;
}

/**
 * Parse `text` as a quantity of dimension `dim` and return its SI value.
 * `where` names the field, e.g. "runs[0].material.eta".
 */
export function toSI(text: string, dim: Dimension, where: string): number {
  let u: Unit;
  try {
    u = parseUnit(text);
  } catch (e) {
    throw new UnitError(
      `${(e as Error).message} for ${where}; give a number and a unit, e.g. "1 ${dim.shown}"`,
    );
  }
  if (dim === DIMENSIONS.temperature && /deg[CF]|celsius|fahrenheit/i.test(text)) {
    throw new UnitError(
      `"${text}" for ${where} uses an offset temperature scale; give the temperature difference in K`,
    );
  }
  if (dim === DIMENSIONS.angularVelocity) {
    if (/hz/i.test(text)) {
      throw new UnitError(
        `"${text}" for ${where} is a frequency in cycles; give the angular velocity in rad/s (Ω = 2π·f)`,
      );
    }
    if (u.equalBase(unit("rad s^-1"))) return u.toNumber("rad s^-1");
    if (u.equalBase(unit("s^-1"))) return u.toNumber("s^-1");
  } else if (u.equalBase(unit(dim.si))) {
    return u.toNumber(dim.si);
  }
  throw new UnitError(
    `"${text}" for ${where} is ${describeDimension(u)}, expected ${/^[aeiou]/.test(dim.name) ? "an" : "a"} ${dim.name} (${dim.shown})`,
  );
}

/** Vacuum permeability μ0 in N/A², from mathjs's physical constants (CODATA). */
export function mu0(): number {
  return magneticConstant.toNumber("N A^-2");
}

/**
 * Magnetic field scale √(ρ μ0 η Ω) in tesla, the unit of B in the 2001 community
 * dynamo benchmark (Christensen et al. 2001, PEPI 128).
 */
export function fieldScaleTesla(density: number, eta: number, omega: number): number {
  return Math.sqrt(density * mu0() * eta * omega);
}
