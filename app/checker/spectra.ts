/** Spectral diagnostics (family F): decay from peak to truncation, pile-up at the tail. */

export interface SpectrumStats {
  column: string;
  peakDegree: number;
  truncationDegree: number;
  /** log10(peak / energy at the truncation degree) */
  decades: number;
  /** least-squares slope of log10(E) against l over the last degrees (decades per degree) */
  tailSlope: number | undefined;
}

export function decadesOfDecay(l: readonly number[], e: readonly number[]): { decades: number; peakDegree: number } {
  let peak = -Infinity;
  let peakDegree = l[0] ?? 0;
  e.forEach((v, i) => {
    if (v > peak) {
      peak = v;
      peakDegree = l[i] ?? 0;
    }
  });
  const last = e[e.length - 1] ?? 0;
  const decades = last <= 0 ? (peak > 0 ? Infinity : 0) : Math.log10(peak / last);
  return { decades, peakDegree };
}

/** Slope of log10 E over the last `k` degrees; zeros are skipped. */
export function tailSlope(l: readonly number[], e: readonly number[], k: number): number | undefined {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = Math.max(0, e.length - k); i < e.length; i++) {
    const v = e[i] ?? 0;
    if (v > 0) {
      xs.push(l[i] ?? 0);
      ys.push(Math.log10(v));
    }
  }
  if (xs.length < 2) return undefined;
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let sxy = 0;
  let sxx = 0;
  xs.forEach((x, i) => {
    sxy += (x - mx) * ((ys[i] ?? 0) - my);
    sxx += (x - mx) ** 2;
  });
  return sxx === 0 ? undefined : sxy / sxx;
}

export function spectrumStats(cols: Record<string, number[]>, pileupDegrees: number): SpectrumStats[] {
  const l = cols.l ?? [];
  const out: SpectrumStats[] = [];
  for (const [name, e] of Object.entries(cols)) {
    if (name === "l") continue;
    const { decades, peakDegree } = decadesOfDecay(l, e);
    out.push({
      column: name,
      peakDegree,
      truncationDegree: l[l.length - 1] ?? 0,
      decades,
      tailSlope: tailSlope(l, e, pileupDegrees),
    });
  }
  return out;
}
