import { href, redirect } from "react-router";
import { notFound, requireSubmission } from "~/access/page-guards.server";
import type { Route } from "./+types/index";

/** The submission's address opens the latest round this person may open. */
export async function loader(args: Route.LoaderArgs) {
  const { found } = await requireSubmission(args);
  const latest = found.rounds.at(-1);
  if (!latest) throw notFound();
  throw redirect(href("/venues/:venueId/submissions/:submissionId/rounds/:round", { venueId: found.venue.id, submissionId: found.submission.id, round: String(latest.round.number) }));
}

/** Never shown: the loader redirects; a component makes a refusal render as the error page, not as raw text. */
export default function Redirecting() {
  return null;
}
