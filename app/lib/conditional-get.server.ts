import { createHash } from "node:crypto";

/**
 * JSON with an entity tag, answered 304 when the browser already holds that body (RFC 9110
 * §8.8.3 ETag, §13.1.2 If-None-Match). `private, no-cache` lets the browser keep the body but
 * makes it ask every time, so access is checked on each request before a 304 is given.
 */

/** Weak tag: the body is the same JSON whether or not the server compresses it on the way out. */
export function etagOf(body: string): string {
  return `W/"${createHash("sha256").update(body).digest("base64url").slice(0, 27)}"`;
}

/** If-None-Match names this tag (weak comparison, RFC 9110 §8.8.3.2), or is `*`. */
export function etagMatches(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  const opaque = (tag: string) => tag.trim().replace(/^W\//, "");
  const wanted = opaque(etag);
  return ifNoneMatch.split(",").some((tag) => tag.trim() === "*" || opaque(tag) === wanted);
}

export function jsonWithEtag(request: Request, value: unknown): Response {
  const body = JSON.stringify(value);
  const headers = { etag: etagOf(body), "cache-control": "private, no-cache" };
  if (etagMatches(request.headers.get("if-none-match"), headers.etag)) return new Response(null, { status: 304, headers });
  return new Response(body, { headers: { ...headers, "content-type": "application/json; charset=utf-8" } });
}
