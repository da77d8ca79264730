/**
 * CSV writing per RFC 4180: records end with CRLF; a field containing a comma, a double quote,
 * CR or LF is enclosed in double quotes, and a double quote inside it is doubled (§2, rules 6–7).
 */
export type Cell = string | number | boolean | null | undefined;

/**
 * Text a spreadsheet would run as a formula (leading =, +, -, @, or a tab or carriage return before
 * one) gets a leading apostrophe, as the OWASP "CSV Injection" page recommends. Numbers stay numbers.
 */
export function neutraliseFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

export function csvField(value: Cell): string {
  if (value === null || value === undefined) return "";
  const s = typeof value === "number" ? (Number.isFinite(value) ? String(value) : "") : neutraliseFormula(String(value));
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(header: string[], rows: Cell[][]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(",")).join("\r\n") + "\r\n";
}
