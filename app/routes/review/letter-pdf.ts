import { data } from "react-router";
import { requireSubmissionAccess } from "~/auth/guards.server";
import { roundContext } from "~/review/context.server";
import { letterFor, pdfResponse } from "~/review/documents.server";
import type { Route } from "./+types/letter-pdf";

/** The released decision letter with remarks: authors, co-authors and the venue's editors. */
export async function loader(args: Route.LoaderArgs) {
  const { db, submission } = await requireSubmissionAccess(args, args.params.submissionId, ["author", "co-author", "editor"]);
  if (submission.venueId !== args.params.venueId) throw data("Not found", { status: 404 });
  const ctx = await roundContext(db, { submissionId: submission.id, number: Number(args.params.round) || 0 });
  if (!ctx.round.releasedAt) throw data("No decision has been released for this round yet.", { status: 404 });
  return pdfResponse(await letterFor(db, ctx), `decision-round-${ctx.round.number}.pdf`);
}
