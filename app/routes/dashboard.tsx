import { requireUser } from "~/auth/guards.server";
import { dashboardFor, type DashboardItem } from "~/dashboard/queries.server";
import type { Route } from "./+types/dashboard";

export const meta: Route.MetaFunction = () => [{ title: "What needs me · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { user, db } = await requireUser(args);
  const lists = await dashboardFor(db, user.id);
  return { name: user.name, admin: user.role === "admin", ...lists };
}

const stageLabel: Record<string, string> = {
  draft: "draft, not yet sent",
  "with-editor": "waiting for the editor",
  "in-review": "with reviewers",
  decided: "decided",
  withdrawn: "withdrawn",
};

function Section({ title, items, empty, testId }: { title: string; items: DashboardItem[]; empty: string; testId: string }) {
  return (
    <section className="card" aria-labelledby={`${testId}-h`} data-testid={testId}>
      <h2 id={`${testId}-h`} className="text-lead">
        {title}
      </h2>
      {items.length === 0 ? (
        <p className="mt-2 text-caption text-basalt-soft">{empty}</p>
      ) : (
        <ul className="mt-3 divide-y divide-rule">
          {items.map((s) => (
            <li key={s.id} className="py-2">
              <span className="font-semibold">{s.title}</span>
              <span className="ml-2 text-caption text-basalt-soft">
                {s.venueName} · {stageLabel[s.stage] ?? s.stage}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

export default function Dashboard({ loaderData: d }: Route.ComponentProps) {
  const holdsNothing =
    !d.admin && d.editorVenues.length === 0 && !d.authored.length && !d.coAuthored.length && !d.reviewing.length;
  return (
    <main className="mx-auto max-w-5xl p-gutter">
      <h1 className="text-title">What needs you, {d.name}</h1>
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
            items={d.editing}
            empty="No rounds are waiting for you."
            testId="role-editor"
          />
        ) : null}
        {d.reviewing.length > 0 ? (
          <Section title="As reviewer" items={d.reviewing} empty="No reviews are due." testId="role-reviewer" />
        ) : null}
        {d.authored.length > 0 ? (
          <Section title="Your submissions" items={d.authored} empty="" testId="role-author" />
        ) : null}
        {d.coAuthored.length > 0 ? (
          <Section title="As co-author" items={d.coAuthored} empty="" testId="role-co-author" />
        ) : null}
        {d.admin ? (
          <section className="card" data-testid="role-admin">
            <h2 className="text-lead">As instance administrator</h2>
            <p className="mt-2 text-caption">
              Manage venues, editors and accounts under <a href="/admin">Instance</a>.
            </p>
          </section>
        ) : null}
      </div>
    </main>
  );
}
