import { data } from "react-router";
import { requireSubmissionAccess } from "~/auth/guards.server";
import { InvalidInput, StateConflict } from "~/workspace/types";
import { roundContext } from "./context.server";
import { reviewOf } from "./reviews.server";

type Args = Parameters<typeof requireSubmissionAccess>[0] & { params: Record<string, string | undefined> };

function roundNumber(raw: string | undefined) {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw data("Not found", { status: 404 });
  return n;
}

/** Every loader and action of the review cycle starts here: the guard, then the round. */
async function load(args: Args, roles: Parameters<typeof requireSubmissionAccess>[2]) {
  const found = await requireSubmissionAccess(args, args.params.submissionId!, roles);
  if (args.params.venueId && args.params.venueId !== found.submission.venueId) throw data("Not found", { status: 404 });
  const ctx = await roundContext(found.db, { submissionId: found.submission.id, number: roundNumber(args.params.round) });
  return { ...found, ctx };
}

export const editorRound = (args: Args) => load(args, ["editor"]);
export const authorRound = (args: Args) => load(args, ["author", "co-author"]);

/** A reviewer sees a round only while holding a report on it (not merely the submission). */
export async function reviewerRound(args: Args) {
  const found = await load(args, ["reviewer"]);
  const review = await reviewOf(found.db, found.ctx.round.id, found.user.id);
  if (!review) throw data("Not found", { status: 404 });
  return { ...found, review };
}

/** Domain errors become a 400/409 answer the page can show next to the form. */
export function asActionError(error: unknown) {
  if (error instanceof StateConflict) return data({ ok: false as const, error: error.message, issues: [] as { path: string; message: string }[] }, { status: 409 });
  if (error instanceof InvalidInput) return data({ ok: false as const, error: error.message, issues: error.issues }, { status: 400 });
  throw error;
}
