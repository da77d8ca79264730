/**
 * Radial points inside the Ekman layer δ = E^½·L (family F), counted on the declared
 * grid. Chebyshev–Gauss–Lobatto nodes r_k = r_i + D(1 − cos(πk/(N−1)))/2,
 * k = 0…N−1; uniform nodes r_k = r_i + D·k/(N−1). The boundary node is counted.
 */

export type GridKind = "chebyshev" | "uniform";

export function gridNodes(kind: GridKind, n: number, ri: number, D: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < n; k++) {
    const s = kind === "chebyshev" ? (1 - Math.cos((Math.PI * k) / (n - 1))) / 2 : k / (n - 1);
    out.push(ri + D * s);
  }
  return out;
}

/**
 * Points within δ of each boundary; `min` is the smaller count. Counted by formula, without
 * building the grid: node k lies within δ of r_i when s_k ≤ (δ+ε)/D, i.e. k ≤ (N−1)·x with
 * x = (δ+ε)/D (uniform) or x = acos(1 − 2(δ+ε)/D)/π (Chebyshev). Both grids are symmetric about
 * mid-gap, so the outer count equals the inner one. The candidate count is then confirmed on the
 * exact node expression, so rounding at a boundary node cannot shift it.
 */
export function pointsInLayer(
  kind: GridKind,
  n: number,
  ri: number,
  D: number,
  delta: number,
): { inner: number; outer: number; min: number } {
  if (!(n >= 2) || !(D > 0)) return { inner: 0, outer: 0, min: 0 };
  const eps = 1e-12 * D;
  const s = (k: number) => (kind === "chebyshev" ? (1 - Math.cos((Math.PI * k) / (n - 1))) / 2 : k / (n - 1));
  const within = (k: number) => k >= 0 && k < n && ri + D * s(k) - ri <= delta + eps;
  const reach = Math.min(1, Math.max(0, (delta + eps) / D));
  const x = kind === "chebyshev" ? Math.acos(Math.max(-1, 1 - 2 * reach)) / Math.PI : reach;
  let last = Math.min(n - 1, Math.floor((n - 1) * x));
  while (last + 1 < n && within(last + 1)) last++;
  while (last >= 0 && !within(last)) last--;
  const inner = last + 1;
  return { inner, outer: inner, min: inner };
}
