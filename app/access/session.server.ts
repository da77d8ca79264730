import { data, redirect, href } from "react-router";
import type { RouterContextProvider } from "react-router";
import { auth } from "~/auth/auth.server";
import { dbContext } from "~/db.server";
import { memo } from "./request-memo.server";

type Args = { request: Request; context: Pick<RouterContextProvider, "get"> };
export type SessionUser = NonNullable<Awaited<ReturnType<typeof lookUpSession>>>;

async function lookUpSession(request: Request) {
  const session = await auth.api.getSession({ headers: request.headers });
  return session?.user ?? null;
}

/** The signed-in person or null, looked up once per request however many loaders ask. */
export function sessionUser(args: Args) {
  return memo(args.context, "session-user", () => lookUpSession(args.request));
}

/** For callers outside the router context (the API's session fallback). */
export const sessionUserOf = lookUpSession;

/** Where a signed-out visitor is sent: sign-in, then back to the page they asked for. */
export function signInRedirect(request: Request) {
  const url = new URL(request.url);
  const next = url.pathname.replace(/\.data$/, "") + url.search;
  return redirect(`${href("/sign-in")}?next=${encodeURIComponent(next)}`);
}

/** The signed-in person, or a redirect to sign-in. */
export async function requireUser(args: Args) {
  const user = await sessionUser(args);
  if (!user) throw signInRedirect(args.request);
  return { user, db: args.context.get(dbContext) };
}

/** Instance administrators only (the admin pages are no secret, so others get a plain 403). */
export async function requireAdmin(args: Args) {
  const found = await requireUser(args);
  if (found.user.role !== "admin") throw data("Only instance administrators can open this page.", { status: 403 });
  return found;
}
