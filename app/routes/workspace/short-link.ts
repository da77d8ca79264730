import { redirect } from "react-router";
import { currentRoundNumber, requireWorkspace } from "~/workspace/access.server";
import type { Route } from "./+types/short-link";

/** `/submissions/:id` → the latest round the person may see. */
export async function loader(args: Route.LoaderArgs) {
  const { db, submission, isAuthor } = await requireWorkspace(args, args.params.submissionId);
  const n = await currentRoundNumber(db, submission.id, isAuthor);
  throw redirect(`/venues/${submission.venueId}/submissions/${submission.id}/rounds/${n}`);
}
