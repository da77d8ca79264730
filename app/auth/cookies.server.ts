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
