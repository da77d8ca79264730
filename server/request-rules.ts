/**
 * Which requests may carry a body, how large, and from which origin: the rules the server entry
 * applies before any route reads a byte. Pure functions, so tests can read them route by route.
 */

/** Methods that never change anything; everything else is a write. */
export const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** React Router's data requests end in `.data` (`/sign-in.data`, `/_root.data`); rules look at the page path. */
export function pagePath(path: string): string {
  if (path === "/_root.data") return "/";
  return path.endsWith(".data") ? path.slice(0, -".data".length) : path;
}

/** The public API authenticates writes with bearer tokens, never cookies; better-auth checks Origin itself. */
export function isExemptFromOriginCheck(path: string): boolean {
  return path.startsWith("/api/v1/") || path === "/api/v1" || path.startsWith("/api/auth/");
}

/** Routes that receive files: uploaded run records, CSV series, manuscripts; the public API. */
export function takesUploads(path: string): boolean {
  const page = pagePath(path);
  return page.startsWith("/api/v1/") || /\/(attachments|files|runs)$/.test(page);
}

/** Files sent whole to the client (PDFs, CSV exports, downloads): a slow reader holds the answer open for long. */
export function isFileDownload(path: string): boolean {
  return /\.(pdf|csv)$/.test(path) || /\/downloads?\//.test(path);
}

/** Raw (non-form) bodies are for the public API, the auth endpoint and CSV uploads only. */
export function acceptsRawBody(path: string): boolean {
  const page = pagePath(path);
  return page.startsWith("/api/v1/") || page.startsWith("/api/auth/") || /\/attachments$/.test(page);
}

export type Limits = { formBytes: number; uploadBytes: number };

export function bodyLimitFor(path: string, limits: Limits): number {
  return takesUploads(path) ? limits.uploadBytes : limits.formBytes;
}

/**
 * Is this write from one of our own pages? A browser always sends Origin on a cross-site POST; a
 * missing or foreign one is refused. Our own origin is APP_URL's, or the one the request was sent to.
 */
export function originAllowed(origin: string | undefined, allowed: readonly string[]): boolean {
  if (!origin || origin === "null") return false;
  return allowed.includes(origin.toLowerCase());
}

const FORM_TYPES = ["application/x-www-form-urlencoded", "multipart/form-data"];

/** The media type, lower-cased, without parameters. */
export function mediaType(contentType: string | undefined): string {
  return (contentType ?? "").split(";")[0]!.trim().toLowerCase();
}

export function isFormBody(contentType: string | undefined): boolean {
  return FORM_TYPES.includes(mediaType(contentType));
}
