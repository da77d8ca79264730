/** Shared types of the checker engine. */

export type Severity = "mismatch" | "caution" | "note";

export type Family = "A" | "B" | "C" | "D" | "E" | "F" | "G" | "H" | "I" | "J" | "K";

/** One finding of the checker. */
export interface Flag {
  rule: string;
  severity: Severity;
  quantities: string[];
  message: string;
  expected?: number | string;
  found?: number | string;
  tolerance?: number | string;
  source: string;
  /** label of the run the flag belongs to (claim flags that concern one run) */
  run?: string;
  /** index into `claim.stated` when the flag comes from a stated value */
  claimRow?: number;
}

/** Static description of a rule, for the help page and for the flags. */
export interface RuleInfo {
  id: string;
  family: Family;
  title: string;
  /** one line shown to reviewers */
  explanation: string;
  severities: Severity[];
  /** key of the policy object that sets the threshold, when there is one */
  policyKey?: string;
  /** human description of the threshold, with its default */
  threshold?: string;
  source: string;
}

export interface RunLength {
  viscous?: number;
  magnetic?: number;
  thermal?: number;
  rotations?: number;
  overturns?: number;
}

export interface AveragingWindow {
  magnetic?: number;
  overturns?: number;
}

/** Statistics of one column of an attached time series (contract: derived.series). */
export interface SeriesSummary {
  /** mean after the transient */
  mean: number;
  /** batch-means standard error of that mean */
  stderr: number;
  /** integrated autocorrelation time, in samples */
  tauInt: number;
  effectiveSamples: number;
  /** end of the initial transient (MSER-5), in the run's time unit */
  transientEnd: number;
  /** two-halves z score; absent when it is not finite (a constant column) */
  z?: number;
}

/** The contract's `derived` object: every key absent when it cannot be known. */
export interface Derived {
  E?: number;
  Ra?: number;
  RaRotating?: number;
  RaBuoyancy?: number;
  RaFlux?: number;
  Pr?: number;
  Pm?: number;
  q?: number;
  chi?: number;
  Emag_ekman?: number;
  Re?: number;
  Rm?: number;
  Ro?: number;
  Rol?: number;
  Lo?: number;
  Lambda?: number;
  NOverOmega?: number;
  tangentCylinderLatitudeDeg?: number;
  layerThicknessKm?: number;
  layerTangentLatitudeDeg?: number;
  runLength?: RunLength;
  averagingWindow?: AveragingWindow;
  series?: Record<string, SeriesSummary>;
}

export interface RunResult {
  label: string;
  derived: Derived;
  flags: Flag[];
}

export interface CheckOutput {
  runs: RunResult[];
  claimFlags: Flag[];
}

/** Build a flag from a rule's static info. */
export function flagOf(
  info: RuleInfo,
  severity: Severity,
  quantities: string[],
  message: string,
  extra: Partial<Pick<Flag, "expected" | "found" | "tolerance" | "run" | "claimRow">> = {},
): Flag {
  return { rule: info.id, severity, quantities, message, ...extra, source: info.source };
}

/** Relative difference |found − expected| / |expected| (0 when both are 0). */
export function relDiff(found: number, expected: number): number {
  if (found === expected) return 0;
  const d = Math.abs(expected);
  return d === 0 ? Infinity : Math.abs(found - expected) / d;
}

/**
 * The one number format of messages: `digits` significant figures, plain between 1e-3 and
 * 1e5, otherwise as 1.235e-5 (no "+", no trailing zeros), so two numbers of a message
 * always read alike.
 */
export function formatNumber(x: number, digits: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return String(Number(x.toPrecision(digits)));
  return x.toExponential(digits - 1).replace(/\.?0+e/, "e").replace("e+", "e");
}

/** Numbers in messages: 4 significant figures. */
export function fmt(x: number): string {
  return formatNumber(x, 4);
}

/** A relative tolerance as people read it: 0.02 → "2 % relative". */
export function relativeTolerance(t: number): string {
  return `${fmt(100 * t)} % relative`;
}

export function isNum(x: unknown): x is number {
  return typeof x === "number" && Number.isFinite(x);
}
