import { href, redirect } from "react-router";
import { notFound, requireSubmission } from "~/access/page-guards.server";
import type { Route } from "./+types/submission-link";

/**
 * `/submissions/:id` (the short link in mail) and the submission-level `manuscript.pdf` of earlier
 * versions: the latest round the person may open, or its manuscript.
 */
export async function loader(args: Route.LoaderArgs) {
  const { found } = await requireSubmission(args);
  const latest = found.rounds.at(-1);
  if (!latest) throw notFound();
  const params = { venueId: found.venue.id, submissionId: found.submission.id, round: String(latest.round.number) };
  const pdf = new URL(args.request.url).pathname.endsWith("/manuscript.pdf");
  return redirect(pdf ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/manuscript.pdf", params) : href("/venues/:venueId/submissions/:submissionId/rounds/:round", params), 301);
}

/** Never shown: the loader redirects; a component makes a refusal render as the error page, not as raw text. */
export default function Redirecting() {
  return null;
}
