/**
 * One passing and one failing input for every rule. `fail` must raise at least one
 * flag of `rule` (with `severity` when given); `pass` must raise none. The `source`
 * names where the expected numbers come from.
 */
import { ar1, baseHydro, baseRun, merge, times } from "./helpers.ts";

export interface RuleCase {
  rule: string;
  source: string;
  pass: unknown;
  fail: unknown;
  severity?: "mismatch" | "caution" | "note";
}

const one = (run: unknown, extra: object = {}) => ({ runs: [run], ...extra });
const claim = (stated: unknown[], runs = [{ label: "ref-A", part: "reference" }], varies: string[] = []) => ({
  format: "runproof.claim/1", title: "test claim", runs, varies, stated,
});

// Earth's core: r_o = 3480 km (PREM, Dziewonski & Anderson 1981), Ω = 7.292115e-5 rad/s (WGS84)
const RO = 3480e3;
const OMEGA = 7.292115e-5;
const D = RO * (1 - 0.35);
const NU = 1e-6;
const E_EARTH = NU / (OMEGA * D * D); // E = ν/(Ω D²), definition
const earth = { nu: "1e-6 m^2/s", omega: "7.292115e-5 rad/s", outerRadius: "3480 km" };

// α g ΔT D³/(ν κ), definition of the classical Rayleigh number
const RA_MAT = (1e-5 * 10 * 1e-3 * D ** 3) / (NU * 1e-5);
const raMaterial = { ...earth, kappa: "1e-5 m^2/s", alpha: "1e-5 K^-1", gravity: "10 m/s^2", deltaT: "1e-3 K" };
// g F/(4π ρ Ω³ D⁴), the flux-based Rayleigh number of the contract
const RAF = (10 * 1e4) / (4 * Math.PI * 1.1e4 * OMEGA ** 3 * D ** 4);
const fluxMaterial = { ...earth, gravity: "10 m/s^2", buoyancyFlux: "1e4 kg/s", density: "1.1e4 kg/m^3" };
const fluxRun = (Ra: number, diag: object = {}) =>
  baseRun({ conventions: { rayleigh: "flux" }, controls: { E: E_EARTH, Ra }, material: fluxMaterial, diagnostics: diag });

// Case 1 published values (Christensen et al. 2001, PEPI 128): E_kin 30.773, E_mag 626.41
const EKIN = 30.773;
const EMAG = 626.41;
const RE1 = Math.sqrt(2 * EKIN); // 7.845
const LAMBDA1 = 2 * 1e-3 * 5 * EMAG; // 6.264

const stationary = (n: number, m: number, sd: number, seed = 3) => ar1(n, 0.3, seed).map((x) => m + sd * x);
const withSeries = (cols: Record<string, number[]>, run = baseRun()) =>
  ({ runs: [run], series: { "ref-A": { t: times(cols[Object.keys(cols)[0] ?? ""]?.length ?? 0, 0, 20), ...cols } } });
const transient = (n: number) => stationary(n, 10, 0.1).map((x, i) => x + 8 * Math.exp(-i / 15));
const ramp = (n: number) => stationary(n, 10, 0.1).map((x, i) => x + (5 * i) / n);

const spectrum = (decades: number, tail: (l: number, e: number) => number = (_l, e) => e) => {
  const l = Array.from({ length: 48 }, (_, i) => i + 1);
  return { l, kinetic: l.map((x) => tail(x, 10 * Math.pow(10, (-decades * (x - 1)) / 47))) };
};
const withSpectrum = (s: Record<string, number[]>, res: object = { maxDegree: 48 }) =>
  ({ runs: [baseRun({ resolution: res })], spectra: { "ref-A": s } });

const stratB = (patch: object = {}) => merge(baseRun({ label: "strat-B", stableLayer: { position: "top", edgeRadius: 1.4 } }), patch);
const pair = (b: unknown, varies = ["stableLayer"], a: unknown = baseRun()) => ({
  runs: [a, b],
  claim: claim([], [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }], varies),
});

// Ra* = Ra E²/Pr = 0.1, Nu = 5: Ra_Q* = Ra*(Nu−1)E/Pr = 4e-5, Ro fit 0.85·Ra_Q*^0.41 (scaling study, Geophys. J. Int. 166, 97–114)
const RO_FIT = 0.85 * Math.pow(4e-5, 0.41);
const regime = (Ro: number) => baseRun({ controls: { E: 1e-4, Ra: 1e7 }, diagnostics: { Nu: 5, Ro } });

const bench = (diag: object, controls: object = {}) =>
  baseRun({
    benchmark: "dynamo-2001-case-1",
    controls,
    boundaries: { inner: { velocity: "no-slip", thermal: "fixed-value", magnetic: "insulating", rotation: "fixed" } },
    diagnostics: diag,
  });

// ---- K helpers: Re = 2·Ra^0.5 with ±2 % scatter over Ra = 1e5…3e6 (a factor 30).
const RAS = [1e5, 3e5, 1e6, 3e6];
const SCATTER = [1.01, 0.99, 1.02, 0.98];
const scalingRuns = (count = 4, dropRe?: number) =>
  RAS.slice(0, count).map((Ra, i) =>
    baseRun({ label: `ra-${i}`, controls: { Ra }, diagnostics: i === dropRe ? {} : { Re: 2 * Math.sqrt(Ra) * (SCATTER[i] ?? 1) } }));
const scaling = (value: string, count = 4, dropRe?: number) => {
  const runs = scalingRuns(count, dropRe);
  return {
    runs,
    claim: claim([{ quantity: "Re", scalesWith: "Ra", value }], runs.map((r) => ({ label: r.label as string, part: "varied" })), ["controls.Ra", "diagnostics"]),
  };
};
const ratioPair = (value: string, lambdaB = 2.6) => ({
  runs: [baseRun({ diagnostics: { Lambda: 2 } }), baseRun({ label: "strat-B", diagnostics: { Lambda: lambdaB } })],
  claim: claim([{ quantity: "Lambda", ratio: ["strat-B", "ref-A"], value }], [{ label: "ref-A", part: "reference" }, { label: "strat-B", part: "varied" }], ["diagnostics"]),
});

export const CASES: RuleCase[] = [
  // ---- A: definitions of E, Pr, Pm, Ra with PREM radius and WGS84 rotation
  { rule: "A.ekman-from-material", source: "E = ν/(Ω D²); PREM r_o; WGS84 Ω", pass: one(baseRun({ controls: { E: E_EARTH }, material: earth })), fail: one(baseRun({ controls: { E: 2 * E_EARTH }, material: earth })) },
  { rule: "A.pr-from-diffusivities", source: "Pr = ν/κ", pass: one(baseRun({ material: { nu: "1e-6 m^2/s", kappa: "1e-6 m^2/s" } })), fail: one(baseRun({ material: { nu: "1e-6 m^2/s", kappa: "1e-7 m^2/s" } })) },
  { rule: "A.pm-from-diffusivities", source: "Pm = ν/η", pass: one(baseRun({ material: { nu: "1e-6 m^2/s", eta: "2e-7 m^2/s" } })), fail: one(baseRun({ material: { nu: "1e-6 m^2/s", eta: "8e-7 m^2/s" } })) },
  { rule: "A.ra-from-material", source: "Ra = αg0ΔT D³/(νκ)", pass: one(baseRun({ controls: { E: E_EARTH, Ra: RA_MAT, Pr: 0.1 }, material: raMaterial })), fail: one(baseRun({ controls: { E: E_EARTH, Ra: 1.1 * RA_MAT, Pr: 0.1 }, material: raMaterial })) },
  { rule: "A.raflux-from-material", source: "Ra_F = g0F/(4πρΩ³D⁴)", pass: one(fluxRun(RAF, { Nu: 3 })), fail: one(fluxRun(1.5 * RAF, { Nu: 3 })) },
  { rule: "A.flux-needs-nu", source: "scaling study 2006 (Geophys. J. Int. 166, 97–114): Ra_Q* = Ra*·Nu*", severity: "note", pass: one(fluxRun(RAF, { Nu: 3 })), fail: one(fluxRun(RAF)) },
  // ---- B: significant-figure reading (common practice)
  { rule: "B.stated-value", source: "common practice: '1e-3' is [0.5e-3, 1.5e-3)", pass: one(baseRun(), { claim: claim([{ quantity: "E", value: "1e-3" }]) }), fail: one(baseRun(), { claim: claim([{ quantity: "E", value: "2e-3" }]) }) },
  { rule: "B.stated-vs-material", source: "Pm = ν/η", pass: one(baseRun({ material: { nu: "1e-6 m^2/s", eta: "2e-7 m^2/s" } }), { claim: claim([{ quantity: "Pm", value: "5" }]) }), fail: one(baseRun({ material: { nu: "1e-6 m^2/s", eta: "8e-7 m^2/s" } }), { claim: claim([{ quantity: "Pm", value: "5" }]) }) },
  { rule: "B.stated-unverifiable", source: "common practice", severity: "note", pass: one(baseRun({ diagnostics: { Re: 7.8 } }), { claim: claim([{ quantity: "Re", value: "≈ 7.8" }]) }), fail: one(baseRun(), { claim: claim([{ quantity: "Re", value: "≈ 7.8" }]) }) },
  // ---- C: identities; case 1 numbers from Christensen et al. 2001
  { rule: "C.rm-re-pm", source: "Rm = Re·Pm", pass: one(baseRun({ diagnostics: { Re: RE1, Rm: 5 * RE1 } })), fail: one(baseRun({ diagnostics: { Re: RE1, Rm: 45 } })) },
  { rule: "C.ro-re-e", source: "Ro = Re·E", pass: one(baseRun({ diagnostics: { Re: RE1, Ro: RE1 * 1e-3 } })), fail: one(baseRun({ diagnostics: { Re: RE1, Ro: 0.01 } })) },
  { rule: "C.rm-ro-pm-e", source: "Rm = Ro·Pm/E", pass: one(baseRun({ diagnostics: { Ro: 0.007845, Rm: 39.225 } })), fail: one(baseRun({ diagnostics: { Ro: 0.007845, Rm: 50 } })) },
  { rule: "C.lambda-lo-pm-e", source: "Λ = Lo²·Pm/E", pass: one(baseRun({ diagnostics: { Lambda: LAMBDA1, Lo: Math.sqrt((LAMBDA1 * 1e-3) / 5) } })), fail: one(baseRun({ diagnostics: { Lambda: LAMBDA1, Lo: 0.05 } })) },
  { rule: "C.re-kinetic-energy", source: "Christensen et al. 2001: E_kin = 30.773 → Re = √(2E_kin) = 7.845", pass: one(baseRun({ diagnostics: { kineticEnergy: EKIN, Re: 7.845 } })), fail: one(baseRun({ diagnostics: { kineticEnergy: EKIN, Re: 9 } })) },
  { rule: "C.lambda-magnetic-energy", source: "Christensen et al. 2001: E_mag = 626.41 → Λ = 2·E·Pm·E_mag = 6.264", pass: one(baseRun({ diagnostics: { magneticEnergy: EMAG, Lambda: 6.26 } })), fail: one(baseRun({ diagnostics: { magneticEnergy: EMAG, Lambda: 3.13 } })) },
  // ---- D: minimum run lengths are venue policy (common practice)
  { rule: "D.min-magnetic-times", source: "common practice: ≥ 1 magnetic diffusion time; t_mag = t_visc/Pm", severity: "caution", pass: one(baseRun()), fail: one(baseRun({ time: { end: 2 } })) },
  { rule: "D.min-overturns", source: "common practice: ≥ 10 overturns; overturns = t_visc·Re", severity: "caution", pass: one(baseHydro({ time: { end: 5 } })), fail: one(baseHydro({ time: { end: 0.5 } })) },
  { rule: "D.run-length-unknown", source: "common practice", severity: "note", pass: one(baseRun()), fail: one(baseRun({ time: undefined })) },
  { rule: "D.series-span", source: "common practice", pass: withSeries({ Re: stationary(50, 7.8, 0.1) }), fail: { runs: [baseRun()], series: { "ref-A": { t: times(50, 0, 10), Re: stationary(50, 7.8, 0.1) } } } },
  { rule: "D.stated-run-length", source: "t_mag = t_visc/Pm = 20/5 = 4", pass: one(baseRun(), { claim: claim([{ quantity: "runLength.magnetic", value: "≥ 1.5" }]) }), fail: one(baseRun({ time: { end: 2 } }), { claim: claim([{ quantity: "runLength.magnetic", value: "≥ 1.5" }]) }) },
  // ---- E: output analysis
  { rule: "E.transient", source: "MSER-5 (White 1997) finds a planted exponential transient", severity: "note", pass: withSeries({ Re: stationary(400, 10, 0.1) }), fail: withSeries({ Re: transient(400) }) },
  { rule: "E.transient-long", source: "MSER-5 (White 1997): minimum at half the series means no steady state", severity: "caution", pass: withSeries({ Re: transient(400) }), fail: withSeries({ Re: ramp(400) }) },
  { rule: "E.stationarity", source: "two-halves z score (Geweke 1992 style), |z| > 3", severity: "caution", pass: withSeries({ Re: stationary(400, 10, 0.1) }), fail: withSeries({ Re: stationary(400, 10, 0.1).map((x, i) => x + (i > 300 ? 1 : 0)) }) },
  { rule: "E.effective-samples", source: "ESS = n/τ_int ≤ n (definition; Sokal 1997): 8 rows cannot give 10", severity: "caution", pass: withSeries({ Re: stationary(400, 10, 0.1) }), fail: withSeries({ Re: stationary(8, 10, 0.1) }) },
  { rule: "E.diagnostic-vs-series", source: "contract family E: max(2 % relative, 3 batch-means standard errors)", severity: "mismatch", pass: withSeries({ Re: stationary(400, 7.8, 0.1) }, baseRun({ diagnostics: { Re: 7.8 } })), fail: withSeries({ Re: stationary(400, 7.8, 0.1) }, baseRun({ diagnostics: { Re: 9 } })) },
  { rule: "E.stated-average", source: "batch means standard error", pass: { ...withSeries({ Rm: stationary(400, 500, 5) }), claim: claim([{ quantity: "Rm", value: "≈ 500" }]) }, fail: { ...withSeries({ Rm: stationary(400, 500, 5) }), claim: claim([{ quantity: "Rm", value: "≈ 300" }]) } },
  // ---- F: resolution, common practice
  { rule: "F.spectrum-decay", source: "common practice: two decades from peak to truncation", severity: "caution", pass: withSpectrum(spectrum(4)), fail: withSpectrum(spectrum(1.5)) },
  { rule: "F.spectrum-decay", source: "common practice: less than one decade is a mismatch", severity: "mismatch", pass: withSpectrum(spectrum(2.5)), fail: withSpectrum(spectrum(0.5)) },
  { rule: "F.spectrum-pileup", source: "common practice: no rise over the last degrees", severity: "caution", pass: withSpectrum(spectrum(4)), fail: withSpectrum(spectrum(4, (l, e) => (l > 43 ? e * Math.pow(3, l - 43) : e))) },
  { rule: "F.spectrum-truncation", source: "common practice", severity: "note", pass: withSpectrum(spectrum(4)), fail: withSpectrum(spectrum(4), { maxDegree: 64 }) },
  { rule: "F.ekman-layer-points", source: "CGL nodes; δ = √E = 0.0316: N = 49 → 6 points, N = 17 → 2 (analytic); ≥ 5 common practice", severity: "caution", pass: one(baseRun({ resolution: { radialPoints: 49, radialGrid: "chebyshev" } })), fail: one(baseRun({ resolution: { radialPoints: 17, radialGrid: "chebyshev" } })) },
  { rule: "F.hyperdiffusion", source: "common practice", severity: "note", pass: one(baseRun({ resolution: { hyperdiffusion: false } })), fail: one(baseRun({ resolution: { hyperdiffusion: true } })) },
  { rule: "F.max-order", source: "spherical harmonics |m| ≤ l", pass: one(baseRun({ resolution: { maxDegree: 48, maxOrder: 48 } })), fail: one(baseRun({ resolution: { maxDegree: 48, maxOrder: 60 } })) },
  // ---- G: comparisons, common practice
  { rule: "G.undeclared-difference", source: "common practice", pass: pair(stratB()), fail: pair(stratB({ boundaries: { outer: { thermal: "fixed-flux" } } })) },
  { rule: "G.resolution-difference", source: "common practice", severity: "caution", pass: pair(stratB({ resolution: { maxDegree: 48 } }), ["stableLayer"], baseRun({ resolution: { maxDegree: 48 } })), fail: pair(stratB({ resolution: { maxDegree: 64 } }), ["stableLayer"], baseRun({ resolution: { maxDegree: 48 } })) },
  { rule: "G.varied-unchanged", source: "common practice", severity: "caution", pass: pair(stratB()), fail: pair(stratB(), ["stableLayer", "controls.Pm"]) },
  { rule: "G.claim-run-missing", source: "common practice", pass: pair(stratB()), fail: { runs: [baseRun()], claim: claim([], [{ label: "ref-A", part: "reference" }, { label: "ghost", part: "varied" }]) } },
  // ---- H: geometry
  { rule: "H.layer-edge-outside", source: "gap units, χ = 0.35: r_i = 0.538, r_o = 1.538", pass: one(baseRun({ stableLayer: { position: "top", edgeRadius: 1.4 } })), fail: one(baseRun({ conventions: { lengthScale: "outer-radius" }, controls: { E: 1e-3 * 0.65 ** 2 }, stableLayer: { position: "top", edgeRadius: 1.3 } })) },
  { rule: "H.reference-body-ratio", source: "PREM: r_i/r_o = 1221.5/3480 = 0.351", severity: "note", pass: one(baseRun({ stableLayer: { position: "top", edgeRadius: 1.4 } })), fail: one(baseRun({ geometry: { radiusRatio: 0.2 }, stableLayer: { position: "top", edgeRadius: 1.1 } })) },
  { rule: "H.stated-geometry", source: "arccos(0.35) = 69.51°", pass: one(baseRun(), { claim: claim([{ quantity: "tangentCylinderLatitudeDeg", value: "69.5" }]) }), fail: one(baseRun(), { claim: claim([{ quantity: "tangentCylinderLatitudeDeg", value: "70.0" }]) }) },
  // ---- I: the 2006 scaling study (Geophys. J. Int. 166), notes only
  { rule: "I.rossby-scaling", source: "scaling study 2006 (Geophys. J. Int. 166, 97–114): Ro = 0.85 Ra_Q*^0.41", severity: "note", pass: one(regime(RO_FIT * 1.2)), fail: one(regime(RO_FIT * 7.5)) },
  { rule: "I.dipolar-boundary", source: "scaling study 2006 (Geophys. J. Int. 166, 97–114): dipolar below Ro_l ≈ 0.12", severity: "note", pass: one(baseRun({ diagnostics: { Rol: 0.05, dipolarity: 0.7 } })), fail: one(baseRun({ diagnostics: { Rol: 0.5, dipolarity: 0.7 } })) },
  // ---- J: benchmark, Christensen et al. 2001 PEPI 128 case 1
  { rule: "J.benchmark-setup", source: "Christensen et al. 2001: case 1 has Pm = 5", pass: one(bench({ kineticEnergy: EKIN })), fail: one(bench({ kineticEnergy: EKIN }, { Pm: 4 })) },
  { rule: "J.benchmark-values", source: "Christensen et al. 2001: E_kin 30.773, E_mag 626.41, ω −3.1017", pass: one(bench({ kineticEnergy: 30.8, magneticEnergy: 626, driftFrequency: -3.10 })), fail: one(bench({ kineticEnergy: 32, magneticEnergy: 626, driftFrequency: -3.10 })) },
  { rule: "J.benchmark-no-values", source: "Christensen et al. 2001", severity: "note", pass: one(bench({ kineticEnergy: EKIN })), fail: one(bench({})) },
  // ---- K: ratio and scaling statements
  { rule: "K.stated-ratio", source: "2.6/2 = 1.3 (arithmetic); \"≈ 1.3\" = [1.17, 1.43] by the contract's ±10 % reading", pass: ratioPair("≈ 1.3"), fail: ratioPair("1.5") },
  { rule: "K.stated-exponent", source: "OLS of log Re on log Ra: b ≈ 0.49 ± 0.01, hand-checked against simple-statistics in power-law.test.ts", pass: scaling("0.5 ± 0.02"), fail: scaling("0.41 ± 0.03") },
  { rule: "K.fit-undecided", source: "OLS needs n ≥ 3 for a standard error (n − 2 degrees of freedom)", severity: "caution", pass: scaling("0.5 ± 0.02"), fail: scaling("0.5 ± 0.02", 2) },
  { rule: "K.unverifiable", source: "common practice: a statement without its inputs is unchecked", severity: "note", pass: ratioPair("≈ 1.3"), fail: scaling("0.5 ± 0.1", 4, 1) },
];
