import { href, Link, NavLink, Outlet } from "react-router";
import { requireSubmission } from "~/access/page-guards.server";
import { shownSubmission } from "~/access/relation.server";
import { roundStateLabel } from "~/review/states";
import type { Route } from "./+types/layout";

/** The submission's header: its title as this person may see it and the rounds they may open. */
export async function loader(args: Route.LoaderArgs) {
  const { found } = await requireSubmission(args);
  const shown = shownSubmission(found);
  return {
    submission: { title: shown.title, venueName: found.venue.name },
    rounds: found.rounds.map((r) => ({ number: r.round.number, state: r.round.state })),
    canReadDetails: found.rounds.at(-1)?.can("read-details") ?? false,
  };
}

export default function SubmissionLayout({ loaderData: d, params }: Route.ComponentProps) {
  const ids = { venueId: params.venueId, submissionId: params.submissionId };
  return (
    <main className="mx-auto max-w-6xl p-gutter">
      <header className="border-b border-rule pb-3" data-testid="submission-header">
        <p className="text-caption text-basalt-soft">{d.submission.venueName}</p>
        <h1 className="text-title">{d.submission.title}</h1>
        <nav aria-label="Rounds" className="mt-2 flex flex-wrap items-center gap-3 text-caption">
          {d.rounds.map((r) => (
            <NavLink
              key={r.number}
              to={href("/venues/:venueId/submissions/:submissionId/rounds/:round", { ...ids, round: String(r.number) })}
              className={({ isActive }) => (isActive ? "font-semibold underline" : "")}
            >
              Round {r.number} · {roundStateLabel(r.state)}
            </NavLink>
          ))}
          {d.canReadDetails ? (
            <Link to={href("/venues/:venueId/submissions/:submissionId/details", ids)} className="ml-auto">
              Manuscript details and co-authors
            </Link>
          ) : null}
        </nav>
      </header>
      <Outlet />
    </main>
  );
}
