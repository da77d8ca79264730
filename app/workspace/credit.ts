/**
 * Contributor roles of CRediT, the Contributor Roles Taxonomy, as standardised in
 * ANSI/NISO Z39.104-2022 (14 roles). Labels are the standard's own wording.
 */
export const CREDIT_ROLES = [
  "Conceptualization",
  "Data curation",
  "Formal analysis",
  "Funding acquisition",
  "Investigation",
  "Methodology",
  "Project administration",
  "Resources",
  "Software",
  "Supervision",
  "Validation",
  "Visualization",
  "Writing – original draft",
  "Writing – review & editing",
] as const;

export type CreditRole = (typeof CREDIT_ROLES)[number];

export function isCreditRole(s: string): s is CreditRole {
  return (CREDIT_ROLES as readonly string[]).includes(s);
}
