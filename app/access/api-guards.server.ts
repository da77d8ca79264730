import { eq } from "drizzle-orm";
import { user } from "~db/schema";
import { apiError } from "~/api/errors.server";
import type { Db } from "~/workspace/types";
import type { Action } from "./round-policy";
import { isId, resolveSubmission, roundNumberParam, type Viewer } from "./relation.server";

/**
 * The public API's adapter of the same access policy the pages use. Unlike the pages it may
 * say "forbidden" (403) and "frozen" (409), but only to a caller who may already open the round;
 * anyone else gets 404, so existence is never revealed.
 */
const NOT_FOUND = "No such submission or round, or you have no access to it.";
const WRITES: ReadonlySet<Action> = new Set(["write-runs", "write-claims", "answer-flags", "send-round"]);

async function viewerOf(db: Db, userId: string): Promise<Viewer> {
  const [row] = await db.select({ id: user.id, email: user.email, role: user.role }).from(user).where(eq(user.id, userId));
  return row ?? null;
}

export async function submissionForApi(db: Db, userId: string, submissionId: string | undefined) {
  if (!isId(submissionId)) throw apiError(404, "not_found", NOT_FOUND);
  const found = await resolveSubmission(db, await viewerOf(db, userId), undefined, submissionId);
  if (!found) throw apiError(404, "not_found", NOT_FOUND);
  return found;
}

export async function roundForApi(db: Db, userId: string, params: { submissionId?: string; round?: string }, action: Action) {
  const number = roundNumberParam(params.round);
  const found = number === null ? null : await submissionForApi(db, userId, params.submissionId);
  const access = found?.rounds.find((r) => r.round.number === number);
  if (!access) throw apiError(404, "not_found", NOT_FOUND);
  if (access.can(action)) return access;
  if (WRITES.has(action) && access.state !== "draft" && (access.relation === "author" || access.relation === "co-author")) {
    throw apiError(409, "conflict", `Round ${access.round.number} was sent to the editor and is frozen; changes go into the next round.`);
  }
  throw apiError(403, "forbidden", "Your role on this round does not allow this call; you may read the round.");
}

/** Path ids are UUIDs; anything else cannot name a row (404, and never a database error). */
export function idParam(value: string | undefined): string {
  if (!isId(value)) throw apiError(404, "not_found", "No such object: the id in the address is not a valid id.");
  return value;
}
