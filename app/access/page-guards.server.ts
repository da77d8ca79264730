import { and, eq } from "drizzle-orm";
import { data, type MiddlewareFunction, type RouterContextProvider } from "react-router";
import { venueMembers } from "~db/schema";
import { dbContext } from "~/db.server";
import type { Action } from "./round-policy";
import { canAtVenue } from "./round-policy";
import { resolveSubmission, isId, roundNumberParam, type RoundAccess, type SubmissionAccess, type Viewer } from "./relation.server";
import { memo } from "./request-memo.server";
import { requireUser } from "./session.server";

/**
 * The pages' adapter of the access policy. A page that does not exist and a page the person may
 * not see answer the same 404 (the one error view), so existence is never revealed; a visitor who
 * is not signed in is sent to sign in first.
 */
type Params = { venueId?: string; submissionId?: string; round?: string };
type Args = { request: Request; context: Pick<RouterContextProvider, "get">; params: Params };

export const notFound = () => data("Not found", { status: 404 });

function submissionOf(args: Args, viewer: Viewer) {
  const { venueId, submissionId } = args.params;
  return memo(args.context, `submission:${venueId}:${submissionId}:${viewer?.id}`, () =>
    resolveSubmission(args.context.get(dbContext), viewer, venueId, submissionId),
  );
}

async function roundOf(args: Args, viewer: Viewer): Promise<RoundAccess | null> {
  const number = roundNumberParam(args.params.round);
  if (number === null) return null;
  const found = await submissionOf(args, viewer);
  return found?.rounds.find((r) => r.round.number === number) ?? null;
}

/**
 * The round layout resolves the person's relation to the round once, before any loader runs;
 * every child then asks the policy for its own action (`requireRound`) and reuses that answer.
 */
export const roundAccessMiddleware: MiddlewareFunction<Response> = async (args, next) => {
  const { user } = await requireUser(args);
  await roundOf(args as unknown as Args, user);
  return next();
};

const AUTHOR_WRITES: ReadonlySet<Action> = new Set(["write-runs", "write-claims", "answer-flags", "send-round", "write-details", "delete-draft"]);

/**
 * The round, when the policy lets this person do `action` in it; else 404. Authors who may read
 * the round but try to change it after it was sent learn why (409): it is their own round.
 */
export async function requireRound(args: Args, action: Action) {
  const { user, db } = await requireUser(args);
  const access = await roundOf(args, user);
  if (!access || !access.can(action)) throw refusal(access, action);
  return { user, db, access };
}

/**
 * For routes a fetcher reads (JSON): the same check, but a refusal that would be the policy's 404
 * comes back as null so the route can return its own 404 — a fetcher's thrown error would replace
 * the whole page with the error view. A redirect to sign in goes on as it is.
 */
export async function requireRoundOrNull(args: Args, action: Action) {
  const { user, db } = await requireUser(args);
  const access = await roundOf(args, user);
  if (access && access.can(action)) return { user, db, access };
  const refused = refusal(access, action);
  if (refused.init?.status === 404) return null;
  throw refused;
}

function refusal(access: RoundAccess | null | undefined, action: Action) {
  if (access && AUTHOR_WRITES.has(action) && access.state !== "draft" && access.can("read-details")) {
    return data(`Round ${access.round.number} was sent to the editor and is frozen; changes go into the next round.`, { status: 409 });
  }
  return notFound();
}

/** The submission with the rounds this person may open; 404 when there are none. */
export async function requireSubmission(args: Args): Promise<{ user: Awaited<ReturnType<typeof requireUser>>["user"]; db: Awaited<ReturnType<typeof requireUser>>["db"]; found: SubmissionAccess }> {
  const { user, db } = await requireUser(args);
  const found = await submissionOf(args, user);
  if (!found) throw notFound();
  return { user, db, found };
}

/** The venue's desk: its editors and the instance admin. */
export async function requireDesk(args: Args) {
  const { user, db } = await requireUser(args);
  const venueId = args.params.venueId;
  if (!isId(venueId)) throw notFound();
  const [editor] = await db
    .select({ role: venueMembers.role })
    .from(venueMembers)
    .where(and(eq(venueMembers.venueId, venueId), eq(venueMembers.userId, user.id), eq(venueMembers.role, "editor")));
  const relation = editor ? "editor" : user.role === "admin" ? "admin" : "none";
  if (!canAtVenue(relation, "read-desk")) throw notFound();
  return { user, db, venueId, relation };
}

/** Submission-level pages (manuscript details): the policy asked about the latest round. */
export async function requireLatestRound(args: Args, action: Action) {
  const { user, db, found } = await requireSubmission(args);
  const latest = found.rounds.at(-1);
  if (!latest || !latest.can(action)) throw refusal(latest, action);
  return { user, db, found, access: latest };
}
