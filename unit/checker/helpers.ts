/** Test helpers: run builders, deterministic random numbers, flag lookup. */
import type { CheckOutput, Flag } from "../../app/checker/index.ts";

type Obj = Record<string, unknown>;

export function merge<T>(a: T, b: unknown): T {
  if (b === undefined) return a;
  if (typeof a !== "object" || a === null || typeof b !== "object" || b === null || Array.isArray(b)) return b as T;
  const out: Obj = { ...(a as Obj) };
  for (const [k, v] of Object.entries(b as Obj)) {
    out[k] = v === undefined ? undefined : merge(out[k], v);
    if (out[k] === undefined) delete out[k];
  }
  return out as T;
}

/** Case 1 of the 2001 benchmark (Christensen et al. 2001, PEPI 128): E 1e-3, Ra 1e5 classical, Pr 1, Pm 5, χ 0.35. */
export function baseRun(patch: unknown = {}): Obj {
  const r: Obj = {
    format: "runproof.run/1",
    label: "ref-A",
    geometry: { radiusRatio: 0.35 },
    conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
    controls: { E: 1e-3, Ra: 1e5, Pr: 1, Pm: 5 },
    time: { start: 0, end: 20 },
  };
  return merge(r, patch);
}

/** The non-magnetic variant (case 0 parameters). */
export function baseHydro(patch: unknown = {}): Obj {
  return merge(baseRun({ controls: { Pm: undefined }, diagnostics: { Re: 10.8 } }), patch);
}

/** Park–Miller style LCG, deterministic. */
export function rng(seed = 7): () => number {
  let s = seed % 2147483647;
  return () => {
    s = (s * 48271) % 2147483647;
    return s / 2147483647;
  };
}

export function gaussian(r: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(Math.max(r(), 1e-300))) * Math.cos(2 * Math.PI * r());
}

/** AR(1): x_t = φ·x_{t−1} + ε_t, stationary start. */
export function ar1(n: number, phi: number, seed = 11): number[] {
  const g = gaussian(rng(seed));
  const out: number[] = [];
  let x = g() / Math.sqrt(1 - phi * phi);
  for (let i = 0; i < n; i++) {
    x = phi * x + g();
    out.push(x);
  }
  return out;
}

export function times(n: number, t0: number, t1: number): number[] {
  return Array.from({ length: n }, (_, i) => t0 + ((t1 - t0) * i) / (n - 1));
}

export function allFlags(out: CheckOutput): Flag[] {
  return [...out.runs.flatMap((r) => r.flags), ...out.claimFlags];
}

export function flagsOf(out: CheckOutput, rule: string): Flag[] {
  return allFlags(out).filter((f) => f.rule === rule);
}
