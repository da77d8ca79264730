/**
 * ORCID iD check digit: ISO 7064 MOD 11-2 over the first 15 digits, as ORCID's
 * "Structure of the ORCID Identifier" documentation describes (the digit may be X for 10).
 */
export function orcidCheckDigit(first15: string): string {
  let total = 0;
  for (const ch of first15) total = (total + Number(ch)) * 2;
  const result = (12 - (total % 11)) % 11;
  return result === 10 ? "X" : String(result);
}

const ORCID_SHAPE = /^(?:https?:\/\/orcid\.org\/)?(\d{4})-(\d{4})-(\d{4})-(\d{3}[\dX])$/i;

export type OrcidResult = { ok: true; value: string } | { ok: false; message: string };

/** Accepts `0000-0002-1825-0097` or its https://orcid.org/ form; returns the bare iD. */
export function parseOrcid(input: string): OrcidResult {
  const match = ORCID_SHAPE.exec(input.trim());
  if (!match) {
    return { ok: false, message: "An ORCID iD has the form 0000-0000-0000-0000 (the last character may be X)." };
  }
  const digits = match.slice(1, 5).join("").toUpperCase();
  const expected = orcidCheckDigit(digits.slice(0, 15));
  if (digits[15] !== expected) {
    return {
      ok: false,
      message: `The last character of this ORCID iD should be ${expected}, not ${digits[15]}: check for a typing error.`,
    };
  }
  return { ok: true, value: match.slice(1, 5).join("-").toUpperCase() };
}
