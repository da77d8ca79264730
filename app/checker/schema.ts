/**
 * zod schemas of the exchange formats: `runproof.run/1`, `runproof.claim/1` and the
 * check input. Every object is strict (unknown keys are rejected with their path).
 * The run and claim schemas carry no transforms, so they export to JSON Schema.
 */
import * as z from "zod";
import { policySchema } from "./policy.ts";
import { isStatable, suggestQuantity } from "./quantity-keys.ts";

export { suggestQuantity };
import { parseStated, StatedValueError } from "./stated.ts";

/**
 * Plausible ranges of the formats' sizes: every count that sets how much work a check does has a
 * ceiling, documented in the JSON Schemas (maximum / maxItems / maxLength).
 */
export const LIMITS = {
  /** Radial grid points; production dynamo runs use a few hundred. */
  radialPoints: 4096,
  /** Spherical-harmonic truncation degree and order. */
  degree: 4096,
  /** Rows of an attached series or spectrum. */
  seriesRows: 200_000,
  /** Columns of an attached series or spectrum, `t` / `l` included. */
  seriesColumns: 32,
  /** Runs in one check or claim. */
  runs: 200,
  /** Characters of a label, name or other short text. */
  shortText: 200,
  /** Characters of a title or a stated value. */
  longText: 2000,
  /** Magnitude of any other number (far beyond any physical value in these records). */
  magnitude: 1e30,
} as const;

const num = () => z.number().min(-LIMITS.magnitude).max(LIMITS.magnitude);
const pos = () => z.number().positive().max(LIMITS.magnitude);
const nonneg = () => z.number().nonnegative().max(LIMITS.magnitude);
const short = () => z.string().max(LIMITS.shortText);
const text = (what: string) => z.string().min(1).max(LIMITS.shortText).describe(what);

const boundarySide = z
  .object({
    velocity: z.enum(["no-slip", "stress-free"]),
    thermal: z.enum(["fixed-value", "fixed-flux"]),
    magnetic: z.enum(["insulating", "conducting"]),
    rotation: z.enum(["fixed", "free"]),
  })
  .partial()
  .strict();

const dimensional = (what: string) => z.string().min(1).max(LIMITS.shortText).describe(`${what}, a number with a unit`);

export const materialSchema = z
  .object({
    nu: dimensional("kinematic viscosity, e.g. \"1e-6 m^2/s\""),
    kappa: dimensional("thermal diffusivity, e.g. \"1e-5 m^2/s\""),
    eta: dimensional("magnetic diffusivity, e.g. \"0.8 m^2/s\""),
    omega: dimensional("rotation rate, e.g. \"7.292115e-5 rad/s\""),
    outerRadius: dimensional("outer radius r_o, e.g. \"3480 km\""),
    alpha: dimensional("thermal expansivity, e.g. \"1e-5 1/K\""),
    gravity: dimensional("gravity at the outer boundary g0, e.g. \"10.7 m/s^2\""),
    deltaT: dimensional("temperature contrast, e.g. \"1e-3 K\""),
    density: dimensional("density, e.g. \"1.1e4 kg/m^3\""),
    buoyancyFlux: dimensional("advected buoyancy flux F, e.g. \"1e4 kg/s\""),
  })
  .partial()
  .strict();

export const runSchema = z
  .object({
    format: z.literal("runproof.run/1"),
    label: text("label, unique within a submission"),
    software: z.object({ name: short(), version: short() }).partial().strict().optional(),
    geometry: z.object({ radiusRatio: z.number().gt(0).lt(1).describe("chi = r_i / r_o") }).strict(),
    conventions: z
      .object({
        lengthScale: z.enum(["gap", "outer-radius"]),
        timeScale: z.enum(["viscous", "magnetic", "thermal", "rotation"]),
        rotationFactor: z.union([z.literal(1), z.literal(2)]),
        rayleigh: z.enum(["classical", "rotating", "buoyancy", "flux"]),
      })
      .strict(),
    controls: z
      .object({ E: pos(), Ra: pos(), Pr: pos(), Pm: pos() })
      .partial()
      .strict()
      .refine((c) => Object.keys(c).length > 0, { message: "controls needs at least one control number (E, Ra, Pr or Pm); the others may follow from material" })
      .describe("control numbers as configured, in the declared conventions; each optional (a missing one is recomputed from material when it can be); Pm absent for a non-magnetic run"),
    material: materialSchema.optional(),
    boundaries: z.object({ inner: boundarySide, outer: boundarySide }).partial().strict().optional(),
    stableLayer: z
      .object({
        position: z.enum(["bottom", "top"]),
        edgeRadius: pos().describe("radius of the layer's edge, in the run's length unit"),
        NOverOmega: nonneg().optional(),
      })
      .strict()
      .optional(),
    resolution: z
      .object({
        radialPoints: z.number().int().min(2).max(LIMITS.radialPoints),
        radialGrid: z.enum(["chebyshev", "uniform", "stretched"]),
        maxDegree: z.number().int().min(1).max(LIMITS.degree),
        maxOrder: z.number().int().min(0).max(LIMITS.degree),
        hyperdiffusion: z.boolean(),
      })
      .partial()
      .strict()
      .optional(),
    time: z
      .object({ scheme: short(), step: pos(), start: num(), end: num() })
      .partial()
      .strict()
      .optional()
      .describe("times in the run's time unit"),
    diagnostics: z
      .object({
        Re: nonneg(), Rm: nonneg(), Ro: nonneg(), Rol: nonneg(), Lo: nonneg(), Lambda: nonneg(),
        kineticEnergy: nonneg(), magneticEnergy: nonneg(),
        dipolarity: z.number().min(0).max(1), ohmicFraction: z.number().min(0).max(1),
        Nu: pos().describe("Nusselt number"),
        driftFrequency: num().describe("drift frequency of the pattern (benchmark)"),
        pointTemperature: num().describe("benchmark point value T"),
        pointUphi: num().describe("benchmark point value u_phi"),
        pointBtheta: num().describe("benchmark point value B_theta"),
      })
      .partial()
      .strict()
      .optional(),
    benchmark: z.enum(["dynamo-2001-case-0", "dynamo-2001-case-1"]).optional(),
  })
  .strict();

export type RunRecord = z.infer<typeof runSchema>;

const quantity = (what: string) =>
  z
    .string()
    .min(1)
    .refine(isStatable, {
      error: (iss) => {
        const typed = String(iss.input);
        const hint = suggestQuantity(typed);
        return `unknown quantity "${typed.slice(0, 60)}"${hint ? ` (did you mean "${hint}"?)` : ""}; use a key of derived such as Rm, Lambda or runLength.magnetic, or a controls key (the list is on the checks help page)`;
      },
    })
    .describe(what);

const statedRow = z
  .object({
    quantity: quantity("a key of derived (dotted for nested ones) or a controls key"),
    value: z.union([z.string().min(1).max(200), z.number()]),
    run: z.string().min(1).optional().describe("the run the value applies to; absent: every run of the claim"),
    ratio: z.tuple([z.string().min(1), z.string().min(1)]).optional().describe("two run labels: the value is quantity(first) / quantity(second)"),
    scalesWith: quantity("x quantity of a power law y ∝ x^b over the claim's runs; the value states the exponent b").optional(),
  })
  .strict();

const claimObject = z
  .object({
    format: z.literal("runproof.claim/1"),
    title: z.string().max(500),
    runs: z.array(z.object({ label: text("run label"), part: text("part, e.g. reference or varied") }).strict()).min(1).max(200),
    varies: z.array(z.string().min(1).max(200)).max(100).optional().describe("dotted paths of the run record that may differ"),
    stated: z.array(statedRow).max(500).optional(),
  })
  .strict();

const RUN_TOP_KEYS = () => Object.keys(runSchema.shape).filter((k) => k !== "format" && k !== "label");

/**
 * The claim format with its cross-field rules, shared by the claim form, the API and the
 * checker's input: an unknown quantity, an unreadable value or a run outside the claim is
 * refused here, with the path of the row, before anything is stored.
 */
export const claimSchema = claimObject.superRefine((claim, ctx) => {
  const labels = new Set<string>();
  claim.runs.forEach((r, i) => {
    if (labels.has(r.label)) ctx.addIssue({ code: "custom", path: ["runs", i, "label"], message: `run "${r.label}" is listed twice; list each run once` });
    labels.add(r.label);
  });
  const known = [...labels].join(", ");
  (claim.varies ?? []).forEach((p, i) => {
    const head = p.split(".")[0] ?? "";
    if (!RUN_TOP_KEYS().includes(head)) {
      ctx.addIssue({ code: "custom", path: ["varies", i], message: `"${p}" is not a path of the run record; start it with one of ${RUN_TOP_KEYS().join(", ")}` });
    }
  });
  (claim.stated ?? []).forEach((row, i) => {
    try {
      parseStated(row.value);
    } catch (e) {
      if (!(e instanceof StatedValueError)) throw e;
      ctx.addIssue({ code: "custom", path: ["stated", i, "value"], message: e.message });
    }
    const kinds = [row.run !== undefined, row.ratio !== undefined, row.scalesWith !== undefined].filter(Boolean).length;
    if (kinds > 1) ctx.addIssue({ code: "custom", path: ["stated", i], message: "a stated value has at most one of run, ratio and scalesWith; split it into separate rows" });
    if (row.run !== undefined && !labels.has(row.run)) {
      ctx.addIssue({ code: "custom", path: ["stated", i, "run"], message: `run "${row.run}" is not among the claim's runs (${known}); add it to the claim's runs or pick one of them` });
    }
    if (row.ratio) {
      row.ratio.forEach((l, j) => {
        if (!labels.has(l)) ctx.addIssue({ code: "custom", path: ["stated", i, "ratio", j], message: `run "${l}" is not among the claim's runs (${known})` });
      });
      if (row.ratio[0] === row.ratio[1]) ctx.addIssue({ code: "custom", path: ["stated", i, "ratio"], message: "a ratio needs two different runs" });
    }
    if (row.scalesWith !== undefined && row.scalesWith === row.quantity) {
      ctx.addIssue({ code: "custom", path: ["stated", i, "scalesWith"], message: "a quantity cannot scale with itself; name another quantity as x" });
    }
  });
});

export type ClaimRecord = z.infer<typeof claimSchema>;

const columns = z
  .record(z.string().max(LIMITS.shortText), z.array(z.number()).max(LIMITS.seriesRows))
  .refine((c) => Object.keys(c).length <= LIMITS.seriesColumns, { message: `at most ${LIMITS.seriesColumns} columns` });
const perRun = <T extends z.ZodType>(what: T) =>
  z.record(z.string().max(LIMITS.shortText), what).refine((r) => Object.keys(r).length <= LIMITS.runs, { message: `at most ${LIMITS.runs} runs` });

export const checkInputSchema = z
  .object({
    runs: z.array(runSchema).min(1).max(LIMITS.runs),
    claim: claimSchema.optional(),
    policy: policySchema.optional(),
    series: perRun(columns).optional(),
    spectra: perRun(columns).optional(),
  })
  .strict();

export type CheckInput = z.infer<typeof checkInputSchema>;

/** Columns of one attached CSV: name → values, first column `t` or `l`. */
export type Columns = Record<string, number[]>;
