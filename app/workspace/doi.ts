/**
 * DOI syntax per ISO 26324 and the DOI Handbook (§2.2): `10.` + registrant code (digits,
 * optionally subdivided by dots) + `/` + a non-empty suffix of printable characters. DOIs are
 * case-insensitive. A resolver URL (`https://doi.org/…`) or a `doi:` prefix is accepted and
 * stripped, so the stored form is the bare DOI.
 */
const DOI = /^10\.\d{4,9}(?:\.\d+)*\/\S+$/;

export function normalizeDoi(input: string): string | null {
  let s = input.trim();
  s = s.replace(/^(?:https?:\/\/(?:dx\.)?doi\.org\/|doi:\s*)/i, "");
  try {
    if (/%[0-9a-f]{2}/i.test(s)) s = decodeURIComponent(s);
  } catch {
    return null;
  }
  return DOI.test(s) ? s : null;
}

/** Splits a free list (commas, blanks, new lines) into DOIs; reports each bad entry. */
export function parseDoiList(text: string): { dois: string[]; bad: string[] } {
  const dois: string[] = [];
  const bad: string[] = [];
  for (const part of text.split(/[\s,;]+/).filter(Boolean)) {
    const d = normalizeDoi(part);
    if (d) {
      if (!dois.some((x) => x.toLowerCase() === d.toLowerCase())) dois.push(d);
    } else bad.push(part);
  }
  return { dois, bad };
}
