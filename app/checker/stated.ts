/**
 * Stated values (family B): a claim's text such as "3.0e-5", "≈ 360", "≥ 1.5",
 * "1–2", "3 × 10^-5", "~1e4", "0.41 ± 0.03" read as an interval that honours the stated precision.
 */
import { formatNumber } from "./types.ts";

export type StatedKind = "value" | "approx" | "order" | "lt" | "le" | "gt" | "ge" | "range" | "plusminus";

export interface Interval {
  kind: StatedKind;
  text: string;
  lo: number;
  hi: number;
  loInclusive: boolean;
  hiInclusive: boolean;
  /** the number as written (the lower end for a range) */
  nominal: number;
}

export class StatedValueError extends Error {}

const SUP: Record<string, string> = {
  "⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7", "⁸": "8", "⁹": "9", "⁻": "-", "⁺": "+",
};

interface ParsedNumber {
  value: number;
  /** half a unit in the last stated digit */
  half: number;
}

const MANTISSA = String.raw`[+-]?(?:\d+(?:\.\d*)?|\.\d+)`;
const NUM_RE = new RegExp(
  String.raw`^(${MANTISSA})?(?:(?:[eE]([+-]?\d+))|(?:\s*(?:[×x*·]\s*)?10\s*\^\s*\(?([+-]?\d+)\)?))?$`,
);

function parseNumber(raw: string, whole: string): ParsedNumber {
  const s = raw.trim().replace(/\s+/g, " ");
  const m = NUM_RE.exec(s);
  if (!m || (m[1] === undefined && m[3] === undefined) || s === "") {
    throw new StatedValueError(
      `cannot read "${whole}" as a number; write e.g. "3e-5", "3 × 10^-5", "≈ 360", "≥ 1.5" or "1–2"`,
    );
  }
  // "10^-5" alone has an implicit mantissa of 1, exact in its digit
  if (m[1] === undefined && !/^10/.test(s)) throw new StatedValueError(`cannot read "${whole}" as a number`);
  const mant = m[1] ?? "1";
  const exp = Number(m[2] ?? m[3] ?? "0");
  const frac = /\.(\d*)/.exec(mant);
  const decimals = frac ? (frac[1] ?? "").length : 0;
  const scale = Math.pow(10, exp);
  const value = Number(mant) * scale;
  const half = 0.5 * Math.pow(10, -decimals) * scale;
  if (!Number.isFinite(value)) throw new StatedValueError(`"${whole}" is not a finite number`);
  return { value, half };
}

function normalise(text: string): string {
  return text
    .trim()
    .replace(/[\u2212\u2012\u2013\u2014]/g, (c) => (c === "\u2212" ? "-" : "–"))
    .replace(/[⁰¹²³⁴⁵⁶⁷⁸⁹⁻⁺]+/g, (m) => "^" + [...m].map((c) => SUP[c] ?? c).join(""))
    .replace(/\s+/g, " ");
}

const PREFIXES: Array<[RegExp, StatedKind]> = [
  [/^(?:≈|about |approx\.? |approximately |circa |ca\. )/i, "approx"],
  [/^(?:~|∼|order of |of order |on the order of )/i, "order"],
  [/^(?:≤|<=|=<)/, "le"],
  [/^(?:≥|>=|=>)/, "ge"],
  [/^(?:<|below |less than )/i, "lt"],
  [/^(?:>|above |more than |greater than )/i, "gt"],
  [/^=/, "value"],
];

/** Parse a stated value into an interval. Throws StatedValueError with a hint. */
export function parseStated(input: string | number): Interval {
  const text = String(input);
  let s = normalise(text);
  let kind: StatedKind = "value";
  for (const [re, k] of PREFIXES) {
    const m = re.exec(s);
    if (m) {
      kind = k;
      s = s.slice(m[0].length).trim();
      break;
    }
  }
  const pm = /^(.+?)\s*(?:±|\+\/-|\+-)\s*(.+)$/.exec(s);
  if (pm && kind === "value") {
    const a = parseNumber(pm[1] ?? "", text);
    const b = parseNumber(pm[2] ?? "", text);
    if (!(b.value >= 0)) throw new StatedValueError(`"${text}": the uncertainty after ± must not be negative`);
    return { kind: "plusminus", text, lo: a.value - b.value, hi: a.value + b.value, loInclusive: true, hiInclusive: true, nominal: a.value };
  }
  const range = /^(.+?)\s*(?:–|\bto\b|(?<=[\d.])\s*-\s*(?=[+-]?[\d.]))\s*(.+)$/.exec(s);
  if (range && kind === "value" && !/[eE^]$/.test(range[1] ?? "")) {
    const a = parseNumber(range[1] ?? "", text);
    const b = parseNumber(range[2] ?? "", text);
    if (a.value > b.value) throw new StatedValueError(`range "${text}" has its lower end last; write "a–b" with a ≤ b`);
    return { kind: "range", text, lo: a.value, hi: b.value, loInclusive: true, hiInclusive: true, nominal: a.value };
  }
  const n = parseNumber(s, text);
  const v = n.value;
  const base = { kind, text, nominal: v };
  switch (kind) {
    case "value":
      return { ...base, lo: v - n.half, hi: v + n.half, loInclusive: true, hiInclusive: false };
    case "approx": {
      const h = Math.max(n.half, 0.1 * Math.abs(v));
      return { ...base, lo: v - h, hi: v + h, loInclusive: true, hiInclusive: true };
    }
    case "order": {
      const r = Math.sqrt(10);
      const [lo, hi] = v >= 0 ? [v / r, v * r] : [v * r, v / r];
      return { ...base, lo, hi, loInclusive: true, hiInclusive: true };
    }
    case "lt":
      return { ...base, lo: -Infinity, hi: v, loInclusive: false, hiInclusive: false };
    case "le":
      return { ...base, lo: -Infinity, hi: v, loInclusive: false, hiInclusive: true };
    case "gt":
      return { ...base, lo: v, hi: Infinity, loInclusive: false, hiInclusive: false };
    case "ge":
      return { ...base, lo: v, hi: Infinity, loInclusive: true, hiInclusive: false };
    default:
      throw new StatedValueError(`cannot read "${text}"`);
  }
}

export function contains(iv: Interval, x: number): boolean {
  const aboveLo = iv.loInclusive ? x >= iv.lo : x > iv.lo;
  const belowHi = iv.hiInclusive ? x <= iv.hi : x < iv.hi;
  return aboveLo && belowHi;
}

/** Does [a, b] overlap the interval? (used for series means with an error bar) */
export function overlaps(iv: Interval, a: number, b: number): boolean {
  return contains(iv, a) || contains(iv, b) || (a <= iv.lo && b >= iv.hi);
}

/** Interval ends keep two more digits than messages' numbers, so a stated digit is never rounded away. */
const g = (x: number) => formatNumber(x, 6);

/** Human description, e.g. `"3.0e-5" = [2.95e-5, 3.05e-5)`. */
export function describe(iv: Interval): string {
  if (iv.lo === -Infinity) return `"${iv.text}" (${iv.hiInclusive ? "≤" : "<"} ${g(iv.hi)})`;
  if (iv.hi === Infinity) return `"${iv.text}" (${iv.loInclusive ? "≥" : ">"} ${g(iv.lo)})`;
  return `"${iv.text}" = ${iv.loInclusive ? "[" : "("}${g(iv.lo)}, ${g(iv.hi)}${iv.hiInclusive ? "]" : ")"}`;
}
