import { href, redirect } from "react-router";
import { roundNumberParam } from "~/access/relation.server";
import { notFound } from "~/access/page-guards.server";
import type { Route } from "./+types/desk-round";

/**
 * `/venues/:v/desk/:s/rounds/:r` (and its `packet.pdf`), the editor's address before the one round
 * tree: a permanent redirect to the round's desk page, which checks access itself.
 */
export function loader({ params, request }: Route.LoaderArgs) {
  if (roundNumberParam(params.round) === null) throw notFound();
  const to = new URL(request.url).pathname.endsWith("/packet.pdf")
    ? href("/venues/:venueId/submissions/:submissionId/rounds/:round/packet.pdf", params)
    : href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", params);
  return redirect(to, 301);
}

/** Never shown: the loader redirects; a component makes a refusal render as the error page, not as raw text. */
export default function Redirecting() {
  return null;
}
