import { DEFAULT_POLICY, policySchema } from "~/checker/policy";

/** The numeric thresholds an editor may override, in the order of the form. */
export const POLICY_FIELDS = (Object.keys(DEFAULT_POLICY) as (keyof typeof DEFAULT_POLICY)[]).filter((k) => typeof DEFAULT_POLICY[k] === "number");

/**
 * Reads the policy form: an empty field means "use the default"; anything else must pass the
 * checker's own `policySchema`, and errors name the field.
 */
export function parsePolicyForm(form: FormData, current: Record<string, unknown>) {
  const next: Record<string, unknown> = "referenceBody" in current ? { referenceBody: current.referenceBody } : {};
  const fieldErrors: Record<string, string> = {};
  for (const key of POLICY_FIELDS) {
    const raw = String(form.get(key) ?? "").trim();
    if (!raw) continue;
    const n = Number(raw);
    if (!Number.isFinite(n)) fieldErrors[key] = `"${raw}" is not a number.`;
    else next[key] = n;
  }
  const parsed = policySchema.safeParse(next);
  if (!parsed.success) for (const issue of parsed.error.issues) fieldErrors[String(issue.path[0])] ??= issue.message;
  return Object.keys(fieldErrors).length ? { ok: false as const, fieldErrors } : { ok: true as const, policy: parsed.data as Record<string, unknown> };
}
