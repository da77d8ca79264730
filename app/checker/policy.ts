/** Venue policy: every threshold of the rules, with defaults and partial overrides. */
import * as z from "zod";
import { EARTH_CORE, type ReferenceBody } from "./reference.ts";

export interface Policy {
  minMagneticTimes: number;
  minOverturns: number;
  identityTolerance: number;
  seriesSpanTolerance: number;
  spectrumCautionDecades: number;
  spectrumMismatchDecades: number;
  pileupDegrees: number;
  pileupMaxSlope: number;
  ekmanLayerPoints: number;
  zScore: number;
  minEffectiveSamples: number;
  mserBatch: number;
  benchmarkTolerance: number;
  regimeFactor: number;
  dipolarityThreshold: number;
  localRossbyBoundary: number;
  referenceBody: ReferenceBody;
}

export const DEFAULT_POLICY: Policy = {
  minMagneticTimes: 1,
  minOverturns: 10,
  identityTolerance: 0.02,
  seriesSpanTolerance: 0.02,
  spectrumCautionDecades: 2,
  spectrumMismatchDecades: 1,
  pileupDegrees: 5,
  pileupMaxSlope: 0,
  ekmanLayerPoints: 5,
  zScore: 3,
  minEffectiveSamples: 10,
  mserBatch: 5,
  benchmarkTolerance: 0.01,
  regimeFactor: 3,
  dipolarityThreshold: 0.35,
  localRossbyBoundary: 0.12,
  referenceBody: EARTH_CORE,
};

const pos = () => z.number().positive();

export const referenceBodySchema = z
  .object({
    name: z.string().min(1),
    innerRadiusKm: z.number().nonnegative(),
    outerRadiusKm: pos(),
  })
  .strict()
  .refine((b) => b.innerRadiusKm < b.outerRadiusKm, {
    message: "innerRadiusKm must be smaller than outerRadiusKm",
  });

/** Partial overrides; unknown keys are rejected. */
export const policySchema = z
  .object({
    minMagneticTimes: z.number().nonnegative(),
    minOverturns: z.number().nonnegative(),
    identityTolerance: pos(),
    seriesSpanTolerance: pos(),
    spectrumCautionDecades: z.number().nonnegative(),
    spectrumMismatchDecades: z.number().nonnegative(),
    pileupDegrees: z.number().int().min(2),
    pileupMaxSlope: z.number(),
    ekmanLayerPoints: z.number().int().nonnegative(),
    zScore: pos(),
    minEffectiveSamples: z.number().nonnegative(),
    mserBatch: z.number().int().min(1),
    benchmarkTolerance: pos(),
    regimeFactor: z.number().min(1),
    dipolarityThreshold: z.number().min(0).max(1),
    localRossbyBoundary: pos(),
    referenceBody: referenceBodySchema,
  })
  .partial()
  .strict();

export type PolicyOverrides = z.infer<typeof policySchema>;

/** Defaults merged with the venue's overrides (already validated). */
export function resolvePolicy(partial: PolicyOverrides | undefined = {}): Policy {
  const out: Policy = { ...DEFAULT_POLICY };
  for (const [k, v] of Object.entries(partial ?? {})) {
    if (v !== undefined) (out as unknown as Record<string, unknown>)[k] = v;
  }
  return out;
}
