import { isAPIError } from "better-auth/api";

/** Copies better-auth's Set-Cookie headers onto our own response (a redirect, usually). */
export function forwardCookies(from: Response, init: Headers = new Headers()) {
  for (const cookie of from.headers.getSetCookie()) init.append("set-cookie", cookie);
  return init;
}

/** better-auth answers errors as JSON `{ code, message }`; this reads it without throwing. */
export async function authErrorOf(res: Response): Promise<{ code?: string; message?: string }> {
  try {
    return (await res.json()) as { code?: string; message?: string };
  } catch {
    return {};
  }
}

/**
 * A refusal thrown by one of our auth hooks (e.g. too many attempts) as the Response the library
 * would have answered over HTTP, so an action handles both the same way; anything else propagates.
 */
export function apiErrorResponse(error: unknown): Response {
  if (!isAPIError(error)) throw error;
  const body = error.body as { code?: string; message?: string } | undefined;
  return Response.json({ code: body?.code, message: body?.message ?? error.message }, { status: error.statusCode });
}
