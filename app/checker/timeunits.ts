/**
 * Run-length conversions (family D). A duration Δ in the run's time unit τ becomes
 * t_visc = Δ·(τ in viscous units) and then, all in the run's length unit L:
 *   magnetic t_mag = t_visc/Pm, thermal t_therm = t_visc/Pr, rotation t_rot = t_visc/E,
 *   rotations = t_rot/(2π·f) (physical turns of the body, so a rotation factor f = 2
 *   still counts whole turns), overturns = t_visc·Re (turnover time L/U).
 * Every quantity is absent when one of its ingredients is unknown.
 */
import { unitInViscous, type TimeScale } from "./conventions.ts";
import type { RunLength } from "./types.ts";

export interface TimeContext {
  timeScale: TimeScale;
  rotationFactor: 1 | 2;
  E?: number;
  Pr?: number;
  Pm?: number;
  Re?: number;
}

export function convertDuration(duration: number, c: TimeContext): RunLength {
  const u = unitInViscous(c.timeScale, c);
  if (u === undefined) return {};
  const viscous = duration * u;
  const out: RunLength = { viscous };
  if (c.Pm !== undefined) out.magnetic = viscous / c.Pm;
  if (c.Pr !== undefined) out.thermal = viscous / c.Pr;
  if (c.E !== undefined) out.rotations = viscous / c.E / (2 * Math.PI * c.rotationFactor);
  if (c.Re !== undefined) out.overturns = viscous * c.Re;
  return out;
}

/** Duration in units of `ts` from one in viscous units (inverse of the first step). */
export function fromViscous(viscous: number, ts: TimeScale, c: Omit<TimeContext, "timeScale">): number | undefined {
  const u = unitInViscous(ts, c);
  return u === undefined ? undefined : viscous / u;
}
