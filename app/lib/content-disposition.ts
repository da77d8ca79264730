/**
 * A Content-Disposition value for any file name (RFC 6266 with RFC 8187 encoding): an ASCII
 * fallback in `filename`, the exact name in `filename*`. Header values must be ASCII, so a name
 * such as "Überströmung.pdf" would otherwise make the response fail.
 */
export function contentDisposition(kind: "inline" | "attachment", filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_").slice(0, 150) || "file";
  const encoded = encodeURIComponent(filename.replace(/[\uD800-\uDFFF]/g, "_")).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${kind}; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}
