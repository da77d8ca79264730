import { and, eq, inArray } from "drizzle-orm";
import { data, redirect } from "react-router";
import { submissionMembers, submissions, venueMembers } from "~db/schema";
import type { Database } from "~db/client";
import { dbContext } from "~/db.server";
import { sessionUser } from "~/middleware.server";
import { auth } from "./auth.server";

type Args = { request: Request; context: { get<T>(key: import("react-router").RouterContext<T>): T } };
export type SessionUser = Awaited<ReturnType<typeof getSessionUser>> & {};
export type SubmissionRole = "author" | "co-author" | "reviewer" | "editor";

export async function getSessionUser(request: Request) {
  const session = await auth.api.getSession({ headers: request.headers });
  return session?.user ?? null;
}

function isApi(request: Request) {
  return new URL(request.url).pathname.startsWith("/api/");
}

/** The signed-in person of a request: one lookup per request through the router context. */
export async function requestUser(args: Args) {
  return sessionUser(args);
}

/** The signed-in person, or a redirect to sign-in (401 JSON for API calls). */
export async function requireUser(args: Args) {
  const user = await requestUser(args);
  if (!user) {
    if (isApi(args.request)) {
      throw Response.json({ error: { code: "unauthenticated", message: "Sign in first." } }, { status: 401 });
    }
    const url = new URL(args.request.url);
    throw redirect(`/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`);
  }
  return { user, db: args.context.get(dbContext) };
}

export async function requireAdmin(args: Args) {
  const found = await requireUser(args);
  if (found.user.role !== "admin") throw data("Only instance administrators can open this page.", { status: 403 });
  return found;
}

async function venueRoles(db: Database, userId: string, venueId: string) {
  const rows = await db
    .select({ role: venueMembers.role })
    .from(venueMembers)
    .where(and(eq(venueMembers.userId, userId), eq(venueMembers.venueId, venueId)));
  return rows.map((r) => r.role);
}

/** Editors of the venue (and instance admins) pass; everyone else gets 404, revealing nothing. */
export async function requireVenueRole(args: Args, venueId: string, roles: "editor"[] = ["editor"]) {
  const found = await requireUser(args);
  if (found.user.role === "admin") return found;
  const held = await venueRoles(found.db, found.user.id, venueId);
  if (!held.some((r) => roles.includes(r))) throw data("Not found", { status: 404 });
  return found;
}

/**
 * Passes when the person holds one of `roles` on the submission; `editor` means an editor of
 * the submission's venue. A miss is 404 so a stranger cannot tell whether the submission exists.
 */
export async function requireSubmissionAccess(args: Args, submissionId: string, roles: SubmissionRole[]) {
  const found = await requireUser(args);
  const memberRoles = roles.filter((r): r is Exclude<SubmissionRole, "editor"> => r !== "editor");
  const [submission] = await found.db
    .select({ id: submissions.id, venueId: submissions.venueId })
    .from(submissions)
    .where(eq(submissions.id, submissionId));
  if (!submission) throw data("Not found", { status: 404 });
  const held: SubmissionRole[] = [];
  if (memberRoles.length > 0) {
    const rows = await found.db
      .select({ role: submissionMembers.role })
      .from(submissionMembers)
      .where(
        and(
          eq(submissionMembers.submissionId, submissionId),
          eq(submissionMembers.userId, found.user.id),
          inArray(submissionMembers.role, memberRoles),
        ),
      );
    held.push(...rows.map((r) => r.role));
  }
  if (roles.includes("editor") && (await venueRoles(found.db, found.user.id, submission.venueId)).includes("editor")) {
    held.push("editor");
  }
  if (held.length === 0) throw data("Not found", { status: 404 });
  return { ...found, submission, roles: held };
}
