import { data, Link, NavLink, Outlet } from "react-router";
import { requireWorkspace } from "~/workspace/access.server";
import { submissionHeader } from "~/workspace/submissions.server";
import type { Route } from "./+types/submission-layout";
import { roundStateLabel } from "~/review/labels";

export async function loader(args: Route.LoaderArgs) {
  const { db, submission, isAuthor } = await requireWorkspace(args, args.params.submissionId);
  if (submission.venueId !== args.params.venueId) throw data("Not found", { status: 404 });
  const header = await submissionHeader(db, submission.id);
  // Editors and reviewers never learn that a draft round exists.
  const rounds = header.rounds.filter((r) => isAuthor || r.state !== "draft");
  return { ...header, rounds, isAuthor };
}

export default function SubmissionLayout({ loaderData: d, params }: Route.ComponentProps) {
  const base = `/venues/${params.venueId}/submissions/${params.submissionId}`;
  return (
    <main className="mx-auto max-w-6xl p-gutter">
      <header className="border-b border-rule pb-3" data-testid="submission-header">
        <p className="text-caption text-basalt-soft">{d.submission.venueName}</p>
        <h1 className="text-title">{d.submission.title}</h1>
        <nav aria-label="Rounds" className="mt-2 flex flex-wrap items-center gap-3 text-caption">
          {d.rounds.map((r) => (
            <NavLink key={r.number} to={`${base}/rounds/${r.number}`} className={({ isActive }) => (isActive ? "font-semibold underline" : "")}>
              Round {r.number} · {roundStateLabel(r.state)}
            </NavLink>
          ))}
          {d.isAuthor ? (
            <Link to={`${base}/details`} className="ml-auto">
              Manuscript details and co-authors
            </Link>
          ) : null}
        </nav>
      </header>
      <Outlet />
    </main>
  );
}
