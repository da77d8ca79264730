import { z } from "zod";

/**
 * Input checks every request passes before a loader or action runs: URL parameters of the right
 * shape (else 404: a malformed id names nothing), and text free of NUL, other control characters
 * and lone surrogates (else 400 with the field's name). Pure, shared by the router middleware,
 * the public API's body parser and the zod schemas.
 */

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** Round numbers are small positive integers (a submission rarely passes ten rounds). */
export const MAX_ROUND = 9999;

/** Why a route parameter cannot name anything, or null when its shape is right. */
export function paramProblem(name: string, value: string | undefined): string | null {
  if (value === undefined || name === "*") return null;
  if (name.endsWith("Id")) return UUID.test(value) ? null : `${name} is not an id`;
  if (name === "round") {
    return /^[1-9][0-9]{0,3}$/.test(value) && Number(value) <= MAX_ROUND ? null : `round must be a whole number from 1 to ${MAX_ROUND}`;
  }
  if (name === "token") return /^[A-Za-z0-9_-]{1,200}$/.test(value) ? null : "token is malformed";
  return value.length > 200 ? `${name} is too long` : null;
}

/** The first malformed parameter, or null. */
export function badParam(params: Record<string, string | undefined>): string | null {
  for (const [name, value] of Object.entries(params)) {
    const problem = paramProblem(name, value);
    if (problem) return problem;
  }
  return null;
}

// C0 controls except tab, line feed and carriage return; DEL.
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** What is wrong with a piece of text, in words, or null when it is fine. */
export function textProblem(value: string): string | null {
  if (value.includes("\u0000")) return "contains a NUL character (\\u0000); remove it and try again";
  if (CONTROL.test(value)) return "contains an invisible control character; retype the text or paste it as plain text";
  if (LONE_SURROGATE.test(value)) return "contains a broken character (a lone UTF-16 surrogate); retype the text or paste it as plain text";
  return null;
}

/**
 * The first bad text anywhere in a parsed JSON value or form, with its path ("runs[0].label").
 * Depth and breadth are bounded by the body size limit; the walk stops at the first problem.
 */
export function findBadText(value: unknown, path = ""): { path: string; message: string } | null {
  const stack: [unknown, string][] = [[value, path]];
  while (stack.length) {
    const [v, p] = stack.pop()!;
    if (typeof v === "string") {
      const problem = textProblem(v);
      if (problem) return { path: p, message: `${p || "the text"} ${problem}` };
    } else if (Array.isArray(v)) {
      v.forEach((item, i) => stack.push([item, `${p}[${i}]`]));
    } else if (v && typeof v === "object") {
      for (const [k, item] of Object.entries(v)) {
        const keyProblem = textProblem(k);
        if (keyProblem) return { path: p, message: `a field name ${keyProblem}` };
        stack.push([item, p ? `${p}.${k}` : k]);
      }
    }
  }
  return null;
}

/** The shared text rule for zod schemas: refuses NUL, control characters and lone surrogates. */
export const cleanText = (schema: z.ZodString = z.string()) =>
  schema.superRefine((value, ctx) => {
    const problem = textProblem(value);
    if (problem) ctx.addIssue({ code: "custom", message: `This ${problem}.` });
  });

/** A same-origin path to go to after signing in: "/x" yes; "//evil", "/\\evil", "https://…" no. */
export function safeLocalPath(next: string | null | undefined, fallback = "/dashboard"): string {
  if (!next || next.length > 2000 || !next.startsWith("/") || textProblem(next)) return fallback;
  // Browsers read a backslash as a slash, and drop tabs and newlines inside URLs (WHATWG URL).
  if (/^\/[\\/]/.test(next) || /[\\\t\r\n]/.test(next)) return fallback;
  try {
    const base = "http://runproof.invalid";
    const url = new URL(next, base);
    if (url.origin !== base) return fallback;
    return url.pathname + url.search + url.hash;
  } catch {
    return fallback;
  }
}
