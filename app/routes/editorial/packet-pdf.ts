import { data } from "react-router";
import { requireSubmissionAccess } from "~/auth/guards.server";
import { roundContext } from "~/review/context.server";
import { packetFor, pdfResponse } from "~/review/documents.server";
import { reviewOf } from "~/review/reviews.server";
import type { Route } from "./+types/packet-pdf";

/** The reviewer packet of a round: for the venue's editors and the round's reviewers. */
export async function loader(args: Route.LoaderArgs) {
  const { db, user, submission, roles } = await requireSubmissionAccess(args, args.params.submissionId, ["editor", "reviewer"]);
  if (submission.venueId !== args.params.venueId) throw data("Not found", { status: 404 });
  const ctx = await roundContext(db, { submissionId: submission.id, number: Number(args.params.round) || 0 });
  if (!roles.includes("editor") && !(await reviewOf(db, ctx.round.id, user.id))) throw data("Not found", { status: 404 });
  return pdfResponse(await packetFor(db, ctx), `packet-round-${ctx.round.number}.pdf`);
}
