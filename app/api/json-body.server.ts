import { findBadText } from "~/lib/edge-input";
import { apiError } from "./errors.server";

/**
 * Reads a JSON body without trusting Content-Length: bytes are counted as they arrive and the
 * read stops at `maxBytes`. Throws a ready API error Response (413 or 400).
 */
export async function readJsonBody(request: Request, maxBytes: number): Promise<unknown> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  const tooLarge = () =>
    apiError(413, "body_too_large", `The request body is larger than ${Math.round(maxBytes / 1024)} KiB.`, [
      { path: "", message: "Send fewer runs per call, or attach long series as CSV uploads." },
    ]);
  if (declared > maxBytes) throw tooLarge();
  if (!request.body) throw apiError(400, "empty_body", "The request has no body; send a JSON object.");
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const text = Buffer.concat(chunks).toString("utf8");
  // Deep nesting would exhaust the stack of the parser or the validators: refused before parsing.
  if (nestingDepth(text) > MAX_JSON_DEPTH) {
    throw apiError(400, "too_deeply_nested", `The JSON nests arrays and objects more than ${MAX_JSON_DEPTH} levels deep; the formats need fewer than 10.`);
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (error) {
    throw apiError(400, "invalid_json", "The request body is not valid JSON.", [
      { path: "", message: error instanceof Error ? error.message : String(error) },
    ]);
  }
  // NUL, control characters and lone surrogates are refused here, once, for every JSON route.
  const bad = findBadText(parsed);
  if (bad) throw apiError(400, "invalid_text", `The text at ${bad.path || "the top level"} cannot be stored: ${bad.message}.`, [bad]);
  return parsed;
}

/** Deepest nesting any run, claim or check input needs is under 10 levels. */
export const MAX_JSON_DEPTH = 64;

/** The deepest nesting of [ and { in JSON text, skipping string contents; one pass, no recursion. */
export function nestingDepth(text: string): number {
  let depth = 0;
  let max = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92) i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 91 || c === 123) max = Math.max(max, ++depth);
    else if (c === 93 || c === 125) depth--;
  }
  return max;
}
