/**
 * The run form mirrors `runproof.run/1` field by field: each input is named by the record's
 * dotted path, so the server's validation errors (which carry that path) land on the input.
 */
export type FieldKind = "number" | "int" | "text" | "enum" | "bool";
export type RunField = { path: string; label: string; kind: FieldKind; options?: readonly string[]; hint?: string; required?: boolean };
export type RunSection = { title: string; fields: RunField[] };

const side = (s: "inner" | "outer"): RunField[] => [
  { path: `boundaries.${s}.velocity`, label: `${s} velocity`, kind: "enum", options: ["no-slip", "stress-free"] },
  { path: `boundaries.${s}.thermal`, label: `${s} thermal`, kind: "enum", options: ["fixed-value", "fixed-flux"] },
  { path: `boundaries.${s}.magnetic`, label: `${s} magnetic`, kind: "enum", options: ["insulating", "conducting"] },
  { path: `boundaries.${s}.rotation`, label: `${s} rotation`, kind: "enum", options: ["fixed", "free"] },
];

const material = (key: string, label: string, example: string): RunField => ({ path: `material.${key}`, label, kind: "text", hint: `with a unit, e.g. ${example}` });

export const RUN_SECTIONS: RunSection[] = [
  {
    title: "Run",
    fields: [
      { path: "label", label: "Label", kind: "text", required: true, hint: "unique within the submission, e.g. strat-B" },
      { path: "software.name", label: "Software", kind: "text" },
      { path: "software.version", label: "Software version", kind: "text" },
      { path: "geometry.radiusRatio", label: "Radius ratio χ = r_i/r_o", kind: "number", required: true },
    ],
  },
  {
    title: "Conventions",
    fields: [
      { path: "conventions.lengthScale", label: "Length scale", kind: "enum", options: ["gap", "outer-radius"], required: true },
      { path: "conventions.timeScale", label: "Time scale", kind: "enum", options: ["viscous", "magnetic", "thermal", "rotation"], required: true },
      { path: "conventions.rotationFactor", label: "Rotation factor in E = ν/(f·Ω·L²)", kind: "enum", options: ["1", "2"], required: true },
      { path: "conventions.rayleigh", label: "Rayleigh number flavour", kind: "enum", options: ["classical", "rotating", "buoyancy", "flux"], required: true },
    ],
  },
  {
    title: "Control numbers",
    fields: [
      { path: "controls.E", label: "Ekman number E", kind: "number", hint: "give at least one control number; one left empty is recomputed from the material properties when they allow it" },
      { path: "controls.Ra", label: "Rayleigh number Ra", kind: "number", hint: "may be left empty when α, g0, ΔT, ν, κ and r_o are given" },
      { path: "controls.Pr", label: "Prandtl number Pr", kind: "number" },
      { path: "controls.Pm", label: "Magnetic Prandtl number Pm", kind: "number", hint: "leave empty for a non-magnetic run" },
    ],
  },
  {
    title: "Material properties (optional)",
    fields: [
      material("nu", "Viscosity ν", "1e-6 m^2/s"),
      material("kappa", "Thermal diffusivity κ", "1e-5 m^2/s"),
      material("eta", "Magnetic diffusivity η", "0.8 m^2/s"),
      material("omega", "Rotation rate Ω", "7.1e-5 rad/s"),
      material("outerRadius", "Outer radius r_o", "1830 km"),
      material("alpha", "Thermal expansivity α", "1e-5 1/K"),
      material("gravity", "Gravity g₀", "3.7 m/s^2"),
      material("deltaT", "Temperature contrast ΔT", "1e-3 K"),
      material("density", "Density ρ", "7000 kg/m^3"),
      material("buoyancyFlux", "Buoyancy flux F", "1e4 kg/s"),
    ],
  },
  { title: "Boundaries", fields: [...side("inner"), ...side("outer")] },
  {
    title: "Stable layer",
    fields: [
      { path: "stableLayer.position", label: "Position", kind: "enum", options: ["bottom", "top"] },
      { path: "stableLayer.edgeRadius", label: "Edge radius (run's length unit)", kind: "number" },
      { path: "stableLayer.NOverOmega", label: "N/Ω", kind: "number" },
    ],
  },
  {
    title: "Resolution",
    fields: [
      { path: "resolution.radialPoints", label: "Radial points", kind: "int" },
      { path: "resolution.radialGrid", label: "Radial grid", kind: "enum", options: ["chebyshev", "uniform", "stretched"] },
      { path: "resolution.maxDegree", label: "Maximum degree ℓ_max", kind: "int" },
      { path: "resolution.maxOrder", label: "Maximum order m_max", kind: "int" },
      { path: "resolution.hyperdiffusion", label: "Hyperdiffusion", kind: "bool" },
    ],
  },
  {
    title: "Time (in the run's time unit)",
    fields: [
      { path: "time.scheme", label: "Scheme", kind: "text" },
      { path: "time.step", label: "Step", kind: "number" },
      { path: "time.start", label: "Start", kind: "number" },
      { path: "time.end", label: "End", kind: "number" },
    ],
  },
  {
    title: "Diagnostics (time averages)",
    fields: ["Re", "Rm", "Ro", "Rol", "Lo", "Lambda", "kineticEnergy", "magneticEnergy", "dipolarity", "ohmicFraction", "Nu"].map((k) => ({
      path: `diagnostics.${k}`,
      label: k,
      kind: "number" as const,
    })),
  },
];

export const RUN_FIELDS = RUN_SECTIONS.flatMap((s) => s.fields);

/** Field id for a dotted path (ids may not contain dots in CSS selectors). */
export const fieldId = (path: string, prefix = "run") => `${prefix}-${path.replace(/\./g, "-")}`;

function setPath(target: Record<string, unknown>, path: string, value: unknown) {
  const parts = path.split(".");
  let node = target;
  for (const p of parts.slice(0, -1)) node = (node[p] ??= {}) as Record<string, unknown>;
  node[parts[parts.length - 1]!] = value;
}

/**
 * Form values → candidate record. Empty inputs are left out (every optional part of the format
 * may be absent); a number that does not parse is kept as text so validation names its field.
 */
export function formToRecord(form: FormData | Map<string, string>): Record<string, unknown> {
  const get = (k: string) => (form instanceof FormData ? form.get(k) : form.get(k));
  const record: Record<string, unknown> = { format: "runproof.run/1" };
  for (const f of RUN_FIELDS) {
    const raw = get(f.path);
    if (typeof raw !== "string" || raw.trim() === "") continue;
    const v = raw.trim();
    if (f.kind === "number" || f.kind === "int" || f.path === "conventions.rotationFactor") {
      const n = Number(v.replace(/[dD]/, "e"));
      setPath(record, f.path, Number.isFinite(n) ? n : v);
    } else if (f.kind === "bool") setPath(record, f.path, v === "true");
    else setPath(record, f.path, v);
  }
  return record;
}

/** Record → the string each input starts with. */
export function recordToValues(record: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  for (const f of RUN_FIELDS) {
    let node: unknown = record;
    for (const p of f.path.split(".")) node = node && typeof node === "object" ? (node as Record<string, unknown>)[p] : undefined;
    if (node !== undefined && node !== null) out[f.path] = String(node);
  }
  return out;
}

const CONTROL_KEYS = new Set(["E", "Ra", "Pr", "Pm"]);
const DIAGNOSTIC_KEYS = new Set(["Re", "Rm", "Ro", "Rol", "Lo", "Lambda", "kineticEnergy", "magneticEnergy", "dipolarity", "ohmicFraction", "Nu"]);
const MATERIAL_KEYS = new Set(["nu", "kappa", "eta", "omega", "outerRadius", "alpha", "gravity", "deltaT", "density", "buoyancyFlux"]);

/** The run-form field a flag's quantity points at, for the flag's link (null when none fits). */
export function fieldForQuantity(quantity: string): string | null {
  const q = quantity.replace(/^(controls|diagnostics|material)\./, "");
  if (CONTROL_KEYS.has(q)) return `controls.${q}`;
  if (DIAGNOSTIC_KEYS.has(q)) return `diagnostics.${q}`;
  if (MATERIAL_KEYS.has(q)) return `material.${q}`;
  if (q.startsWith("runLength") || q.startsWith("averagingWindow")) return "time.end";
  if (q === "chi") return "geometry.radiusRatio";
  if (q.startsWith("layer") || q === "NOverOmega") return "stableLayer.edgeRadius";
  if (q.startsWith("spectrum") || q === "maxDegree") return "resolution.maxDegree";
  return null;
}
