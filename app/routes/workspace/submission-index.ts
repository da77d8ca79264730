import { redirect } from "react-router";
import { currentRoundNumber, requireWorkspace } from "~/workspace/access.server";
import type { Route } from "./+types/submission-index";

export async function loader(args: Route.LoaderArgs) {
  const { db, submission, isAuthor } = await requireWorkspace(args, args.params.submissionId);
  if (submission.venueId !== args.params.venueId) throw new Response("Not found", { status: 404 });
  const n = await currentRoundNumber(db, submission.id, isAuthor);
  throw redirect(`/venues/${submission.venueId}/submissions/${submission.id}/rounds/${n}`);
}
