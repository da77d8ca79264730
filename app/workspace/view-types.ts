/** Shapes the workspace's loaders hand to its components (shared, so components need no server import). */

export type FlagView = {
  id: string;
  rule: string;
  ruleTitle: string;
  /** the rule's family letter (A–K) and its title, for filtering by family */
  family: string;
  familyTitle: string;
  explanation: string;
  severity: "mismatch" | "caution" | "note";
  runLabel: string | null;
  claimId: string | null;
  claimTitle: string | null;
  claimRow: number | null;
  message: string;
  expected: string | null;
  found: string | null;
  tolerance: string | null;
  source: string;
  authorAnswer: string | null;
};

export type RunRow = {
  runId: string;
  label: string;
  version: number;
  origin: string;
  E: number | null;
  Ra: number | null;
  RaRotating: number | null;
  Pr: number | null;
  Pm: number | null;
  Rm: number | null;
  runLengthMagnetic: number | null;
  mismatch: number;
  caution: number;
  note: number;
  /** the run's check has not landed yet: numbers blank, flags may describe an earlier version */
  checking?: boolean;
  /** when the version the round uses was made (ISO 8601) */
  updatedAt?: string;
};

export type SeriesPlot = {
  columns: string[];
  points: Record<string, { x: number; y: number }[]>;
  tStart: number;
  windowStart: number;
  tEnd: number;
  rows: number;
  /** derived.series: per column mean, standard error, τ_int, effective samples, end of transient, z */
  stats?: Record<string, { mean: number; stderr: number; tauInt: number; effectiveSamples: number; transientEnd: number; z?: number }>;
};
export type SpectrumPlot = { columns: string[]; points: { l: number; [k: string]: number }[]; truncationDegree: number };
