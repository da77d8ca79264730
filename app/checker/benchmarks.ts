/**
 * Reference solutions of the 2001 community dynamo benchmark:
 * Christensen et al. 2001, Phys. Earth Planet. Inter. 128, 25–34, table of
 * suggested standard values. Units: length D, time D²/ν, B in √(ρμ0ηΩ);
 * E = ν/(ΩD²), Ra = αg0ΔT D/(νΩ) (the rotating flavour), χ = 0.35, no-slip,
 * fixed-temperature boundaries; case 1 has an insulating inner core fixed to the mantle.
 * Point values are taken at r = (r_i + r_o)/2 in the equatorial plane where u_r = 0
 * and ∂u_r/∂φ > 0. The values are the ones quoted in the paper's table (checked from
 * memory); the ± uncertainties are from memory too and only widen, never narrow,
 * the policy tolerance (default 1 %).
 */

export type BenchmarkId = "dynamo-2001-case-0" | "dynamo-2001-case-1";

export type BenchmarkQuantity =
  | "kineticEnergy" | "magneticEnergy" | "driftFrequency" | "pointTemperature" | "pointUphi" | "pointBtheta";

export interface ReferenceValue {
  value: number;
  /** published uncertainty (from memory) */
  uncertainty: number;
}

export interface Benchmark {
  id: BenchmarkId;
  title: string;
  controls: { E: number; RaRotating: number; Pr: number; Pm?: number; chi: number };
  magnetic: "insulating" | undefined;
  values: Partial<Record<BenchmarkQuantity, ReferenceValue>>;
}

export const BENCHMARK_SOURCE = "Christensen et al. 2001, Phys. Earth Planet. Inter. 128, 25–34";

export const BENCHMARKS: Record<BenchmarkId, Benchmark> = {
  "dynamo-2001-case-0": {
    id: "dynamo-2001-case-0",
    title: "case 0, non-magnetic convection",
    controls: { E: 1e-3, RaRotating: 100, Pr: 1, chi: 0.35 },
    magnetic: undefined,
    values: {
      kineticEnergy: { value: 58.348, uncertainty: 0.05 },
      driftFrequency: { value: 0.1824, uncertainty: 0.0004 },
      pointTemperature: { value: 0.42812, uncertainty: 0.00012 },
      pointUphi: { value: -10.1571, uncertainty: 0.002 },
    },
  },
  "dynamo-2001-case-1": {
    id: "dynamo-2001-case-1",
    title: "case 1, dynamo with an insulating inner core",
    controls: { E: 1e-3, RaRotating: 100, Pr: 1, Pm: 5, chi: 0.35 },
    magnetic: "insulating",
    values: {
      kineticEnergy: { value: 30.773, uncertainty: 0.033 },
      magneticEnergy: { value: 626.41, uncertainty: 0.5 },
      driftFrequency: { value: -3.1017, uncertainty: 0.004 },
      pointTemperature: { value: 0.37338, uncertainty: 0.0004 },
      pointUphi: { value: -7.625, uncertainty: 0.006 },
      pointBtheta: { value: -4.9289, uncertainty: 0.006 },
    },
  },
};
