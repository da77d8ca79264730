import { createContext, type MiddlewareFunction, type RouterContext } from "react-router";
import { auth } from "./auth/auth.server";
import { db, dbContext } from "./db.server";

/** Hands the one database pool to every loader and action through the router context. */
export const dbMiddleware: MiddlewareFunction<Response> = async ({ context }, next) => {
  context.set(dbContext, db);
  return next();
};

export type SessionUser = NonNullable<Awaited<ReturnType<typeof auth.api.getSession>>>["user"];

/** The signed-in person of this request, looked up at most once however many loaders ask. */
export type RequestSession = { user(): Promise<SessionUser | null> };

/**
 * Router-context key of the request's session: `context.get(sessionContext)?.user()`. Null
 * outside the middleware (a loader called directly in a test); callers then look it up themselves.
 */
export const sessionContext = createContext<RequestSession | null>(null);

/** The session of a request through the router context (one lookup per request), or directly. */
export function sessionUser(args: { request: Request; context: { get<T>(key: RouterContext<T>): T } }): Promise<SessionUser | null> {
  const session = args.context.get(sessionContext);
  if (session) return session.user();
  return auth.api.getSession({ headers: args.request.headers }).then((s) => s?.user ?? null);
}

/**
 * Puts a lazy, memoised session lookup in the router context: the nested loaders of one request
 * (shell, submission, round, page) share one lookup, and requests that never ask (API calls
 * with a token, health checks) make none.
 */
export const sessionMiddleware: MiddlewareFunction<Response> = async ({ request, context }, next) => {
  let found: Promise<SessionUser | null> | undefined;
  context.set(sessionContext, {
    user: () => (found ??= auth.api.getSession({ headers: request.headers }).then((s) => s?.user ?? null)),
  });
  return next();
};
