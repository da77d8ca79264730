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

/** Points within δ of each boundary; `min` is the smaller count. */
export function pointsInLayer(
  kind: GridKind,
  n: number,
  ri: number,
  D: number,
  delta: number,
): { inner: number; outer: number; min: number } {
  const nodes = gridNodes(kind, n, ri, D);
  const ro = ri + D;
  const eps = 1e-12 * D;
  const inner = nodes.filter((r) => r - ri <= delta + eps).length;
  const outer = nodes.filter((r) => ro - r <= delta + eps).length;
  return { inner, outer, min: Math.min(inner, outer) };
}
