const SUP: Record<string, string> = { "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "-": "⁻" };

/**
 * A number as people read it: four significant figures, trailing zeros dropped; very small or
 * large magnitudes as "2.5 × 10⁷". Integers below a million (grid sizes, degrees) stay whole.
 */
export function sig4(x: number): string {
  return sigFigs(x, 4);
}

/**
 * The same with `digits` significant figures (1–12): for the ends of an interval read from a
 * stated value, which keep the stated digit (3.0e-5 → 2.95 × 10⁻⁵).
 */
export function sigFigs(x: number, digits: number): string {
  const n = Math.min(12, Math.max(1, Math.round(digits)));
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  if (Number.isInteger(x) && Math.abs(x) < 1e6) return String(x);
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return String(Number(x.toPrecision(n)));
  const [mantissa, exp] = x.toExponential(n - 1).split("e") as [string, string];
  const m = String(Number(mantissa));
  const e = [...String(Number(exp))].map((c) => SUP[c] ?? c).join("");
  return m === "1" ? `10${e}` : m === "-1" ? `−10${e}` : `${m} × 10${e}`;
}

/** A value of unknown type for display: numbers through sig4, the rest as text. */
export function showValue(v: unknown): string {
  if (typeof v === "number") return sig4(v);
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (v === null || v === undefined) return "";
  if (Array.isArray(v)) return v.map(showValue).join(", ");
  if (typeof v === "object") return Object.entries(v as Record<string, unknown>).map(([k, x]) => `${k} ${showValue(x)}`).join(", ");
  return String(v);
}

/** Rounds long decimals inside free text ("found 7.426782210753407") to four significant figures. */
export function roundNumbersIn(text: string): string {
  return text.replace(/-?\d+\.\d{5,}(?:[eE][+-]?\d+)?/g, (m) => sig4(Number(m)));
}
