import { href, redirect } from "react-router";
import { requireSubmission } from "~/access/page-guards.server";
import type { Route } from "./+types/review-round";

/** `/review/:s/rounds/:r`, the reviewer's address before the one round tree: a permanent redirect. */
export async function loader(args: Route.LoaderArgs) {
  const { found } = await requireSubmission(args);
  return redirect(
    href("/venues/:venueId/submissions/:submissionId/rounds/:round/review", { venueId: found.venue.id, submissionId: found.submission.id, round: args.params.round }),
    301,
  );
}

/** Never shown: the loader redirects; a component makes a refusal render as the error page, not as raw text. */
export default function Redirecting() {
  return null;
}
