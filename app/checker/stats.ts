/**
 * Output analysis of simulation time series.
 * - MSER-5: White 1997 (Simulation 69), White, Cobb & Spratt 2000 (WSC).
 * - batch means standard error with ⌊√n⌋ batches (common practice).
 * - two-halves z score in the spirit of Geweke 1992.
 * - integrated autocorrelation time τ = 1 + 2Σρ(t) with Sokal's automatic window
 *   (Sokal 1997, "Monte Carlo methods in statistical mechanics"), ESS = n/τ.
 * Every function takes plain arrays or typed arrays; parts of a typed array are views, never copies.
 */

/** Values of a series: a number[] or a Float64Array (typed columns from the CSV reader). */
export type Values = ArrayLike<number>;

/** x[from, to) without copying when x is a typed array. */
export function part(x: Values, from: number, to = x.length): Values {
  if (x instanceof Float64Array) return x.subarray(from, to);
  return Array.prototype.slice.call(x, from, to) as number[];
}

export function mean(x: Values): number {
  let s = 0;
  const n = x.length;
  for (let i = 0; i < n; i++) s += x[i]!;
  return s / n;
}

/** Unbiased sample variance (n − 1). */
export function variance(x: Values): number {
  const n = x.length;
  if (n < 2) return 0;
  const m = mean(x);
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i]! - m;
    s += d * d;
  }
  return s / (n - 1);
}

/** Means of consecutive batches of `size` values (a trailing partial batch is dropped). */
export function batchMeans(x: Values, size: number): number[] {
  const k = Math.floor(x.length / size);
  const out = new Array<number>(k);
  for (let b = 0, i = 0; b < k; b++) {
    let s = 0;
    for (const end = i + size; i < end; i++) s += x[i]!;
    out[b] = s / size;
  }
  return out;
}

/**
 * MSER-5 truncation: index of the first observation to keep. Minimises
 * MSER(d) = Σ_{j>d}(Z_j − Z̄_d)²/(k − d)² over batch means Z of size 5, d ≤ k/2.
 */
export function mser(x: Values, batch = 5): { truncation: number; batches: number } {
  const z = batchMeans(x, batch);
  const k = z.length;
  if (k < 4) return { truncation: 0, batches: k };
  // suffix sums for O(k)
  const s1 = new Float64Array(k + 1);
  const s2 = new Float64Array(k + 1);
  for (let j = k - 1; j >= 0; j--) {
    const v = z[j]!;
    s1[j] = s1[j + 1]! + v;
    s2[j] = s2[j + 1]! + v * v;
  }
  let best = 0;
  let bestVal = Infinity;
  for (let d = 0; d <= Math.floor(k / 2); d++) {
    const n = k - d;
    const a = s1[d]!;
    const ss = s2[d]! - (a * a) / n;
    const val = Math.max(ss, 0) / (n * n);
    if (bestVal === Infinity || val < bestVal * (1 - 1e-12)) {
      bestVal = val;
      best = d;
    }
  }
  return { truncation: best * batch, batches: k };
}

/** Standard error of the mean by batch means with ⌊√n⌋ batches. */
export function batchMeansSE(x: Values): number {
  const n = x.length;
  if (n < 4) return Math.sqrt(variance(x) / Math.max(n, 1));
  const b = Math.floor(Math.sqrt(n));
  const m = Math.floor(n / b);
  const bm = batchMeans(part(x, n - b * m), m);
  return Math.sqrt(variance(bm) / bm.length);
}

/** z = (mean of first half − mean of second half)/√(SE₁² + SE₂²). */
export function twoHalvesZ(x: Values): number {
  const h = Math.floor(x.length / 2);
  if (h < 2) return 0;
  const a = part(x, 0, h);
  const b = part(x, x.length - h);
  const ma = mean(a);
  const mb = mean(b);
  const d = ma - mb;
  const se = Math.hypot(batchMeansSE(a), batchMeansSE(b));
  const scale = Math.max(Math.abs(ma), Math.abs(mb), 1e-300);
  if (Math.abs(d) <= 1e-12 * scale) return 0;
  return se === 0 ? Math.sign(d) * Infinity : d / se;
}

/** In-place radix-2 FFT of (re, im), length a power of two. */
function fft(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      const tr = re[i] as number;
      re[i] = re[j] as number;
      re[j] = tr;
      const ti = im[i] as number;
      im[i] = im[j] as number;
      im[j] = ti;
    }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const half = len >> 1;
    const ang = (-2 * Math.PI) / len;
    const wStepR = Math.cos(ang);
    const wStepI = Math.sin(ang);
    for (let i = 0; i < n; i += len) {
      let wr = 1;
      let wi = 0;
      for (let k = 0; k < half; k++) {
        const a = i + k;
        const b = a + half;
        const br = re[b] as number;
        const bi = im[b] as number;
        const xr = br * wr - bi * wi;
        const xi = br * wi + bi * wr;
        re[b] = (re[a] as number) - xr;
        im[b] = (im[a] as number) - xi;
        re[a] = (re[a] as number) + xr;
        im[a] = (im[a] as number) + xi;
        const nwr = wr * wStepR - wi * wStepI;
        wi = wr * wStepI + wi * wStepR;
        wr = nwr;
      }
    }
  }
}

/** Normalised autocorrelation ρ(0..n−1) via FFT (biased estimator, divided by n). */
export function autocorrelation(x: Values): Float64Array {
  const n = x.length;
  const m = mean(x);
  let size = 1;
  while (size < 2 * n) size <<= 1;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  for (let i = 0; i < n; i++) re[i] = (x[i] as number) - m;
  fft(re, im);
  for (let i = 0; i < size; i++) {
    re[i] = (re[i] as number) ** 2 + (im[i] as number) ** 2;
    im[i] = 0;
  }
  fft(re, im); // the power spectrum is real and even: a forward FFT equals the inverse up to 1/size
  const c0 = re[0] as number;
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) out[t] = c0 === 0 ? (t === 0 ? 1 : 0) : (re[t] as number) / c0;
  return out;
}

/**
 * Integrated autocorrelation time with Sokal's window: smallest M with M ≥ c·τ(M).
 * When no such M exists (series shorter than a few τ) the largest τ(M) is returned.
 */
export function integratedAutocorrelationTime(x: Values, c = 5): number {
  const n = x.length;
  if (n < 4) return 1;
  const rho = autocorrelation(x);
  let tau = 1;
  let largest = 1;
  for (let m = 1; m < n; m++) {
    tau += 2 * (rho[m] ?? 0);
    largest = Math.max(largest, tau);
    if (m >= c * tau) return Math.max(tau, 1 / n);
  }
  // the window never closed: the series is too short for its correlation; be conservative
  return largest;
}

/** n/τ_int, with τ_int floored at 1 so that anti-correlation never claims more than n samples. */
export function effectiveSampleSize(x: Values, tau = integratedAutocorrelationTime(x)): number {
  return x.length / Math.max(tau, 1);
}
