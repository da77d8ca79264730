import { href, Link } from "react-router";
import { requireUser } from "~/access/session.server";
import { requestRoleSummary } from "~/auth/roles.server";
import { openVenues } from "~/workspace/submissions.server";
import { DASHBOARD_LISTS, dashboardFor, parseListCursor, type DashboardList } from "~/dashboard/queries.server";
import { myDecisions, myInvitations, myReviews, parseReviewCursor } from "~/review/dashboard.server";
import type { Route } from "./+types/dashboard";
import { decisionLabel, submissionStageLabel } from "~/review/labels";

export const meta: Route.MetaFunction = () => [{ title: "What needs me · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { user, db } = await requireUser(args);
  // `?after-editing=…` (and likewise per list) pages one list with a cursor.
  const url = new URL(args.request.url);
  const cursors = Object.fromEntries(DASHBOARD_LISTS.map((l) => [l, parseListCursor(url.searchParams.get(`after-${l}`))]));
  const [lists, reviews, venuesOpen, decisions, invited] = await Promise.all([
    requestRoleSummary(args.context, db, user).then((roles) => dashboardFor(db, user.id, roles, cursors)),
    myReviews(db, user.id, parseReviewCursor(url.searchParams.get("after-reviews"))),
    openVenues(db),
    myDecisions(db, user.id),
    myInvitations(db, user),
  ]);
  return { name: user.name, admin: user.role === "admin", draftDeleted: url.searchParams.get("deleted") === "1", ...lists, reviews, venuesOpen, decisions, invited };
}

function Section({ title, list, name, empty, testId }: { title: string; list: DashboardList; name: string; empty: string; testId: string }) {
  const items = list.items;
  return (
    <section className="card" aria-labelledby={`${testId}-h`} data-testid={testId}>
      <h2 id={`${testId}-h`} className="text-lead">
        {title} <span className="text-caption">({list.total})</span>
      </h2>
      {items.length === 0 ? (
        <p className="mt-2 text-caption text-basalt-soft">{empty}</p>
      ) : (
        <ul className="mt-3 divide-y divide-rule">
          {items.map((s) => (
            <li key={s.id} className="py-2">
              <Link to={href("/venues/:venueId/submissions/:submissionId", { venueId: s.venueId, submissionId: s.id })} className="font-semibold">
                {s.title}
              </Link>
              <span className="ml-2 text-caption text-basalt-soft">
                {s.venueName} · {submissionStageLabel(s.stage)}
              </span>
            </li>
          ))}
        </ul>
      )}
      {list.next ? (
        <p className="mt-2 text-caption">
          <Link to={`?after-${name}=${encodeURIComponent(list.next)}`}>Older submissions</Link>
        </p>
      ) : null}
    </section>
  );
}

export default function Dashboard({ loaderData: d }: Route.ComponentProps) {
  const holdsNothing =
    !d.admin && d.editorVenues.length === 0 && !d.authored.total && !d.coAuthored.total && !d.reviewing.total && d.invited.length === 0;
  return (
    <main className="mx-auto max-w-5xl p-gutter">
      <h1 className="text-title">What needs you, {d.name}</h1>
      {d.draftDeleted ? (
        <p role="status" className="mt-2 text-lichen" data-testid="draft-deleted">
          The draft submission was deleted.
        </p>
      ) : null}
      {holdsNothing ? (
        <p className="mt-3 text-basalt-soft" data-testid="no-roles">
          You hold no role yet. An editor adds you to a venue, or an author lists you on a submission; you can also
          start a submission of your own once a venue is open.
        </p>
      ) : null}
      <div className="mt-6 grid gap-4 md:grid-cols-2">
        {d.editorVenues.length > 0 ? (
          <Section
            title={`As editor of ${d.editorVenues.map((v) => v.name).join(", ")}`}
            list={d.editing}
            name="editing"
            empty="No rounds are waiting for you."
            testId="role-editor"
          />
        ) : null}
        {d.reviewing.total > 0 ? (
          <Section title="As reviewer" list={d.reviewing} name="reviewing" empty="No reviews are due." testId="role-reviewer" />
        ) : null}
        {d.authored.total > 0 ? (
          <Section title="Your submissions" list={d.authored} name="authored" empty="" testId="role-author" />
        ) : null}
        {d.coAuthored.total > 0 ? (
          <Section title="As co-author" list={d.coAuthored} name="coAuthored" empty="" testId="role-co-author" />
        ) : null}
        {d.editorVenues.length > 0 ? (
          <section className="card" data-testid="editor-desks">
            <h2 className="text-lead">Editor's desk</h2>
            <ul className="mt-2">
              {d.editorVenues.map((v) => (
                <li key={v.id}>
                  <a className="underline" href={href("/venues/:venueId/desk", { venueId: v.id })}>{v.name}: rounds, reviewers, decisions</a>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        {d.invited.length > 0 ? (
          <section className="card" data-testid="my-invitations">
            <h2 className="text-lead">Invitations to review</h2>
            <ul className="mt-2 divide-y divide-rule">
              {d.invited.map((i) => (
                <li key={i.id} className="py-1">
                  <Link className="underline" to={i.href}>
                    {i.title}, round {i.round}
                  </Link>
                  <span className="ml-2 text-caption text-basalt-soft">
                    {i.venueName} · report due {i.dueAt} · accept or decline on its page
                  </span>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        {d.reviews.total > 0 ? (
          <section className="card" data-testid="my-reviews">
            <h2 className="text-lead">
              Your reviews <span className="text-caption">({d.reviews.total})</span>
            </h2>
            <ul className="mt-2 divide-y divide-rule">
              {d.reviews.items.map((r) => (
                <li key={r.id} className="py-1">
                  <a className="underline" href={r.href}>{r.title}, round {r.round}</a>
                  <span className="ml-2 text-caption text-basalt-soft">{r.state === "submitted" ? "submitted" : `due ${r.dueAt ?? "—"}`}</span>
                </li>
              ))}
            </ul>
            {d.reviews.next ? (
              <p className="mt-2 text-caption">
                <Link to={`?after-reviews=${encodeURIComponent(d.reviews.next)}`}>Older reviews</Link>
              </p>
            ) : null}
          </section>
        ) : null}
        {d.decisions.length > 0 ? (
          <section className="card" data-testid="my-decisions">
            <h2 className="text-lead">Decisions on your submissions</h2>
            <ul className="mt-2 divide-y divide-rule">
              {d.decisions.map((r) => (
                <li key={r.roundId} className="py-1">
                  <a className="underline" href={r.href}>{r.title}, round {r.round}: {decisionLabel(r.decision)}</a>
                  <span className="ml-2 text-caption text-basalt-soft">released {r.releasedAt}</span>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        {d.venuesOpen.length > 0 ? (
          <section className="card" data-testid="start-submission">
            <h2 className="text-lead">Start a submission</h2>
            <ul className="mt-2">
              {d.venuesOpen.map((v) => (
                <li key={v.id}>
                  <Link to={href("/venues/:venueId/submissions/new", { venueId: v.id })}>Start a submission to {v.name}</Link>
                </li>
              ))}
            </ul>
          </section>
        ) : null}
        {d.admin ? (
          <section className="card" data-testid="role-admin">
            <h2 className="text-lead">As instance administrator</h2>
            <p className="mt-2 text-caption">
              Manage venues, editors and accounts under <Link to={href("/admin")}>Instance</Link>.
            </p>
          </section>
        ) : null}
      </div>
    </main>
  );
}
