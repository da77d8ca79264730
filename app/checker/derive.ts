/**
 * The contract's `derived` object for one run, in the run's declared length scale and
 * rotation factor (`Ra` is always the classical flavour). Sources, in order of
 * priority: controls, diagnostics, attached series (means after the transient),
 * material properties, then the identities of family C. Nothing is guessed.
 */
import { fromClassical, toClassical, unitInViscous, type FlavourContext } from "./conventions.ts";
import type { Recomputed } from "./material.ts";
import type { Policy } from "./policy.ts";
import type { RunRecord } from "./schema.ts";
import type { SeriesStats } from "./series.ts";
import { convertDuration } from "./timeunits.ts";
import { isNum, type Derived, type SeriesSummary } from "./types.ts";
import { layerGeometry } from "./geometry.ts";

export const GIVEN_KEYS = ["Re", "Rm", "Ro", "Rol", "Lo", "Lambda", "kineticEnergy", "magneticEnergy", "Nu", "dipolarity"] as const;
export type GivenKey = (typeof GIVEN_KEYS)[number];
export type Given = Partial<Record<GivenKey, number>>;

/** Diagnostics, completed by series means for keys the diagnostics lack. */
export function givenValues(run: RunRecord, series: SeriesStats | undefined): Given {
  const out: Given = {};
  for (const k of GIVEN_KEYS) {
    const d = run.diagnostics?.[k];
    const s = series?.columns[k]?.mean;
    if (isNum(d)) out[k] = d;
    else if (isNum(s)) out[k] = s;
  }
  return out;
}

/** Velocity in the run's time unit → Reynolds number: Re = u'/(τ in viscous units). */
export function velocityToRe(run: RunRecord, n: { E?: number; Pr?: number; Pm?: number }): number | undefined {
  const u = unitInViscous(run.conventions.timeScale, n);
  return u === undefined ? undefined : 1 / u;
}

function put<K extends keyof Derived>(d: Derived, k: K, v: Derived[K] | undefined): void {
  if (v === undefined) return;
  if (typeof v === "number" && !Number.isFinite(v)) return;
  if (d[k] === undefined) d[k] = v;
}

export function derive(run: RunRecord, rec: Recomputed, given: Given, series: SeriesStats | undefined, policy: Policy, outerRadiusM?: number): Derived {
  const d: Derived = {};
  const c = run.controls;
  const chi = run.geometry.radiusRatio;
  put(d, "E", c.E);
  put(d, "E", rec.E);
  put(d, "Pr", c.Pr);
  put(d, "Pr", rec.Pr);
  put(d, "Pm", c.Pm);
  put(d, "Pm", rec.Pm);
  if (c.Pm !== undefined && c.Pr !== undefined) put(d, "q", c.Pm / c.Pr);
  put(d, "q", rec.q);
  if (d.Pm !== undefined && d.Pr !== undefined) put(d, "q", d.Pm / d.Pr);
  put(d, "chi", chi);

  const fc: FlavourContext = { E: d.E, Pr: d.Pr, lengthScale: run.conventions.lengthScale, chi, ...(given.Nu !== undefined ? { Nu: given.Nu } : {}) };
  if (c.Ra !== undefined) put(d, "Ra", toClassical(c.Ra, run.conventions.rayleigh, fc));
  put(d, "Ra", rec.Ra);
  if (d.Ra !== undefined) {
    put(d, "RaRotating", fromClassical(d.Ra, "rotating", fc));
    put(d, "RaBuoyancy", fromClassical(d.Ra, "buoyancy", fc));
  }
  if (run.conventions.rayleigh === "flux" && c.Ra !== undefined) put(d, "RaFlux", c.Ra);
  else if (d.Ra !== undefined) put(d, "RaFlux", fromClassical(d.Ra, "flux", fc));
  put(d, "RaFlux", rec.RaFlux);
  if (d.Pm !== undefined && d.E !== undefined) put(d, "Emag_ekman", d.E / d.Pm);

  fillIdentities(d, run, given);
  put(d, "NOverOmega", run.stableLayer?.NOverOmega);

  const geo = layerGeometry(run, policy.referenceBody, outerRadiusM);
  put(d, "tangentCylinderLatitudeDeg", geo.tangentCylinderLatitudeDeg);
  put(d, "layerTangentLatitudeDeg", geo.layerTangentLatitudeDeg);
  put(d, "layerThicknessKm", geo.layerThicknessKm);

  const tc = {
    timeScale: run.conventions.timeScale,
    rotationFactor: run.conventions.rotationFactor,
    E: d.E, Pr: d.Pr, Pm: d.Pm, Re: d.Re,
  };
  const t = run.time;
  if (isNum(t?.start) && isNum(t?.end)) {
    const rl = clean(convertDuration(t.end - t.start, tc));
    if (Object.keys(rl).length > 0) d.runLength = rl;
  }
  if (series) {
    const w = clean(convertDuration(series.tEnd - series.windowStart, tc));
    const aw: Derived["averagingWindow"] = {};
    if (w.magnetic !== undefined) aw.magnetic = w.magnetic;
    if (w.overturns !== undefined) aw.overturns = w.overturns;
    if (Object.keys(aw).length > 0) d.averagingWindow = aw;
    d.series = seriesSummary(series);
  }
  return ordered(d);
}

const ORDER: Array<keyof Derived> = [
  "E", "Ra", "RaRotating", "RaBuoyancy", "RaFlux", "Pr", "Pm", "q", "chi", "Emag_ekman", "Re", "Rm", "Ro", "Rol", "Lo",
  "Lambda", "NOverOmega", "tangentCylinderLatitudeDeg", "layerThicknessKm", "layerTangentLatitudeDeg", "runLength", "averagingWindow", "series",
];

/** derived.series: one entry per column of the attached series (computed once, in series.ts). */
export function seriesSummary(s: SeriesStats): Record<string, SeriesSummary> {
  const out: Record<string, SeriesSummary> = {};
  for (const c of Object.values(s.columns)) {
    const e: SeriesSummary = { mean: c.mean, stderr: c.standardError, tauInt: c.tau, effectiveSamples: c.ess, transientEnd: c.truncationTime };
    if (Number.isFinite(c.z)) e.z = c.z;
    out[c.column] = e;
  }
  return out;
}

/** Same keys in the contract's order. */
function ordered(d: Derived): Derived {
  const out: Record<string, unknown> = {};
  for (const k of ORDER) if (d[k] !== undefined) out[k] = d[k];
  return out as Derived;
}

function clean<T extends object>(o: T): T {
  const out = {} as Record<string, number>;
  for (const [k, v] of Object.entries(o)) if (isNum(v)) out[k] = v;
  return out as T;
}

/** Fill Re, Rm, Ro, Rol, Lo, Lambda from given values and the family C identities. */
function fillIdentities(d: Derived, run: RunRecord, g: Given): void {
  for (const k of ["Re", "Rm", "Ro", "Rol", "Lo", "Lambda"] as const) put(d, k, g[k]);
  const E = d.E;
  const Pm = d.Pm;
  const k = velocityToRe(run, d);
  for (let pass = 0; pass < 3; pass++) {
    if (E !== undefined && Pm !== undefined) {
      if (d.Rm !== undefined) put(d, "Re", d.Rm / Pm);
      if (d.Ro !== undefined) put(d, "Re", d.Ro / E);
    }
    if (E !== undefined && d.Ro !== undefined) put(d, "Re", d.Ro / E);
    if (g.kineticEnergy !== undefined && k !== undefined) put(d, "Re", Math.sqrt(2 * g.kineticEnergy) * k);
    if (d.Re !== undefined && Pm !== undefined) put(d, "Rm", d.Re * Pm);
    if (d.Re !== undefined && E !== undefined) put(d, "Ro", d.Re * E);
    if (E !== undefined && Pm !== undefined) {
      if (d.Lo !== undefined) put(d, "Lambda", (d.Lo * d.Lo * Pm) / E);
      if (g.magneticEnergy !== undefined && run.conventions.timeScale === "viscous") {
        put(d, "Lambda", 2 * E * Pm * g.magneticEnergy);
      }
      if (d.Lambda !== undefined) put(d, "Lo", Math.sqrt((d.Lambda * E) / Pm));
    }
  }
}
