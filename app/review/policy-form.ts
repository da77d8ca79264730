import { DEFAULT_POLICY, policySchema, type Policy } from "~/checker/policy";
import { rules } from "~/checker/registry";

type NumericKey = { [K in keyof Policy]: Policy[K] extends number ? K : never }[keyof Policy];

/** Each threshold in words, with its unit, for the venue's policy form. */
const WORDS: Record<NumericKey, { label: string; unit: string }> = {
  minMagneticTimes: { label: "Shortest acceptable run, in magnetic diffusion times", unit: "magnetic diffusion times" },
  minOverturns: { label: "Shortest acceptable run, in overturn times", unit: "overturn times" },
  identityTolerance: { label: "Tolerance for identities and recomputed control numbers", unit: "relative difference (0.02 = 2 %)" },
  seriesSpanTolerance: { label: "Allowed gap between a series' time span and the run's stated time", unit: "fraction of the run length" },
  spectrumCautionDecades: { label: "Spectrum fall below which a caution is raised", unit: "decades (powers of ten) from peak to truncation" },
  spectrumMismatchDecades: { label: "Spectrum fall below which a mismatch is raised", unit: "decades (powers of ten) from peak to truncation" },
  pileupDegrees: { label: "Highest degrees examined for energy piling up at truncation", unit: "spherical-harmonic degrees" },
  pileupMaxSlope: { label: "Steepest allowed rise of the spectrum's tail", unit: "log₁₀ energy per degree" },
  ekmanLayerPoints: { label: "Radial grid points required inside the Ekman layer", unit: "grid points" },
  zScore: { label: "Distance between a stated value and a series mean before a flag", unit: "standard errors" },
  minEffectiveSamples: { label: "Fewest independent samples in an averaging window", unit: "effective samples" },
  mserBatch: { label: "Batch size when finding the end of the initial transient", unit: "samples per batch" },
  benchmarkTolerance: { label: "Tolerance against a published benchmark value", unit: "relative difference (0.01 = 1 %)" },
  regimeFactor: { label: "How far outside a published regime before a note", unit: "factor (3 = three times above or below)" },
  dipolarityThreshold: { label: "Dipolarity above which a field counts as dipolar", unit: "fraction of the surface field in the dipole, 0 to 1" },
  localRossbyBoundary: { label: "Local Rossby number where dipolar dynamos turn multipolar", unit: "local Rossby number (no unit)" },
};

/** The numeric thresholds an editor may override, in the order of the form. */
export const POLICY_FIELDS = (Object.keys(DEFAULT_POLICY) as (keyof typeof DEFAULT_POLICY)[]).filter((k): k is NumericKey => typeof DEFAULT_POLICY[k] === "number");

export type PolicyFieldInfo = { key: NumericKey; label: string; unit: string; defaultValue: number; rules: { id: string; title: string }[] };

/** Words, unit, default and the checker rules each threshold governs (read from the rules' own entries). */
export const POLICY_FIELD_INFO: PolicyFieldInfo[] = POLICY_FIELDS.map((key) => ({
  key,
  ...WORDS[key],
  defaultValue: DEFAULT_POLICY[key] as number,
  rules: rules
    .filter((r) => r.policyKey === key || r.threshold?.includes(`policy.${key}`) || r.explanation.includes(`policy.${key}`))
    .map((r) => ({ id: r.id, title: r.title })),
}));

/**
 * Reads the policy form: an empty field means "use the default"; anything else must pass the
 * checker's own `policySchema`, and errors name the field.
 */
export function parsePolicyForm(form: FormData, current: Record<string, unknown>) {
  const next: Record<string, unknown> = "referenceBody" in current ? { referenceBody: current.referenceBody } : {};
  const fieldErrors: Record<string, string> = {};
  const words = (key: string) => WORDS[key as NumericKey]?.label ?? key;
  for (const key of POLICY_FIELDS) {
    const raw = String(form.get(key) ?? "").trim();
    if (!raw) continue;
    if (raw.length > 40) {
      fieldErrors[key] = `${words(key)}: enter a number of at most 40 characters.`;
      continue;
    }
    const n = Number(raw);
    if (!Number.isFinite(n)) fieldErrors[key] = `${words(key)}: "${raw}" is not a number.`;
    else next[key] = n;
  }
  const parsed = policySchema.safeParse(next);
  if (!parsed.success) for (const issue of parsed.error.issues) fieldErrors[String(issue.path[0])] ??= `${words(String(issue.path[0]))}: ${issue.message}`;
  return Object.keys(fieldErrors).length ? { ok: false as const, fieldErrors } : { ok: true as const, policy: parsed.data as Record<string, unknown> };
}
