/** The one error shape of the public API: `{ error: { code, message, details } }`. */
export type ApiErrorDetail = { path: string; message: string };

export function apiError(status: number, code: string, message: string, details: ApiErrorDetail[] = []) {
  return Response.json({ error: { code, message, details } }, { status });
}
