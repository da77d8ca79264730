import { sessionUserOf } from "~/access/session.server";
import type { Db } from "~/workspace/types";
import { apiError } from "./errors.server";
import { consumeRateLimit, RATE_LIMIT_PER_MINUTE } from "./rate-limit.server";
import { verifyApiToken, type TokenScope } from "./api-tokens.server";

export type ApiCaller = { userId: string; via: "token" | "session"; scopes: string[] };

const REASONS = {
  unknown: "The token is not known: check that it was copied whole, or create a new one on your account page.",
  revoked: "The token was revoked: create a new one on your account page.",
  expired: "The token has expired: create a new one on your account page.",
} as const;

/**
 * The caller of an API route. A bearer token (`Authorization: Bearer rp_…`) works for every
 * method. Without an Authorization header, the app's own pages may read (GET only) with their
 * session cookie, so fetchers use the same routes; writes always need a token, which keeps
 * cookie-borne cross-site writes out. Throws the API's error Response: 401 no/invalid/revoked/
 * expired credentials, 403 a scope the token lacks, 429 over the per-token rate limit.
 */
export async function requireApiCaller(request: Request, db: Db, opts: { scope: TokenScope }): Promise<ApiCaller> {
  const header = request.headers.get("authorization");
  let caller: ApiCaller;
  if (header) {
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!match) throw apiError(401, "unauthenticated", "Send the token as `Authorization: Bearer rp_…`.");
    const found = await verifyApiToken(db, match[1]!);
    if (!found.ok) throw apiError(401, `token_${found.reason}`, REASONS[found.reason]);
    caller = { userId: found.token.userId, via: "token", scopes: found.token.scopes };
    await limit(`token:${found.token.id}`);
  } else {
    const user = request.method === "GET" || request.method === "HEAD" ? await sessionUserOf(request) : null;
    if (!user) {
      throw apiError(401, "unauthenticated", "Send a personal API token as `Authorization: Bearer rp_…` (create one on your account page).", [], {
        "www-authenticate": 'Bearer realm="runproof"',
      });
    }
    caller = { userId: user.id, via: "session", scopes: ["read"] };
    await limit(`user:${user.id}`);
  }
  if (!caller.scopes.includes(opts.scope)) {
    throw apiError(403, "insufficient_scope", `This call needs a token with the "${opts.scope}" scope.`, [
      { path: "Authorization", message: `The token has ${caller.scopes.map((s) => `"${s}"`).join(", ") || "no scopes"}; create a token with "${opts.scope}".` },
    ]);
  }
  return caller;
}

async function limit(key: string) {
  const wait = await consumeRateLimit(key);
  if (wait !== null) {
    throw apiError(429, "rate_limited", `More than ${RATE_LIMIT_PER_MINUTE} calls in a minute with this token; wait ${wait} s.`, [], {
      "retry-after": String(wait),
    });
  }
}
