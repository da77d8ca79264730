/**
 * Ordinary least squares on logarithms: log y = a + b·log x. The slope's standard error
 * comes from the residuals, SE(b) = √(Σr²/(n−2) / Σ(x−x̄)²) (any statistics handbook).
 */

export interface PowerLawFit {
  n: number;
  /** exponent b */
  exponent: number;
  /** standard error of b; undefined with fewer than 3 points */
  standardError?: number;
  /** prefactor e^a of y = e^a·x^b */
  prefactor: number;
  /** largest x over smallest x */
  span: number;
}

/** Fits y = c·x^b to positive pairs; undefined when fewer than 2 points or all x equal. */
export function fitPowerLaw(xs: readonly number[], ys: readonly number[]): PowerLawFit | undefined {
  const n = Math.min(xs.length, ys.length);
  if (n < 2) return undefined;
  const lx = xs.slice(0, n).map(Math.log);
  const ly = ys.slice(0, n).map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / n;
  const my = ly.reduce((a, b) => a + b, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = (lx[i] as number) - mx;
    sxx += dx * dx;
    sxy += dx * ((ly[i] as number) - my);
  }
  if (!(sxx > 0)) return undefined;
  const b = sxy / sxx;
  const a = my - b * mx;
  const fit: PowerLawFit = { n, exponent: b, prefactor: Math.exp(a), span: Math.max(...xs.slice(0, n)) / Math.min(...xs.slice(0, n)) };
  if (n >= 3) {
    let ss = 0;
    for (let i = 0; i < n; i++) {
      const r = (ly[i] as number) - (a + b * (lx[i] as number));
      ss += r * r;
    }
    fit.standardError = Math.sqrt(ss / (n - 2) / sxx);
  }
  return fit;
}
