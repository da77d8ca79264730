import { eq } from "drizzle-orm";
import { data, Form, href, Link } from "react-router";
import { venues } from "~db/schema";
import { requireDesk } from "~/access/page-guards.server";
import { AdvisoryNote } from "~/components/advisory-note";
import { deskQueue } from "~/review/desk.server";
import { QUEUE_GROUPS } from "~/review/states";
import { PolicyFields } from "~/components/review/policy-fields";
import { parsePolicyForm } from "~/review/policy-form";
import type { Route } from "./+types/desk";
import { decisionLabel } from "~/review/labels";

export const meta: Route.MetaFunction = () => [{ title: "Editor's desk · Runproof" }];

export async function loader(args: Route.LoaderArgs) {
  const { db } = await requireDesk(args);
  const [venue] = await db.select().from(venues).where(eq(venues.id, args.params.venueId));
  if (!venue) throw data("Not found", { status: 404 });
  return { venue: { id: venue.id, name: venue.name, blinding: venue.blinding, policy: venue.checkerPolicy }, queue: await deskQueue(db, venue.id) };
}

export async function action(args: Route.ActionArgs) {
  const { db } = await requireDesk(args);
  const [venue] = await db.select().from(venues).where(eq(venues.id, args.params.venueId));
  if (!venue) throw data("Not found", { status: 404 });
  const parsed = parsePolicyForm(await args.request.formData(), venue.checkerPolicy);
  if (!parsed.ok) return data({ saved: false, fieldErrors: parsed.fieldErrors }, { status: 400 });
  await db.update(venues).set({ checkerPolicy: parsed.policy }).where(eq(venues.id, venue.id));
  return { saved: true, fieldErrors: {} as Record<string, string> };
}

export default function Desk({ loaderData, actionData }: Route.ComponentProps) {
  const { venue, queue } = loaderData;
  return (
    <main className="mx-auto max-w-6xl p-gutter">
      <h1 className="text-title">Editor's desk · {venue.name}</h1>
      <p className="mt-1 text-caption text-basalt-soft">Review is {venue.blinding}-blind at this venue.</p>
      <AdvisoryNote className="mt-3" />
      <div className="mt-6 grid gap-4 lg:grid-cols-4">
        {QUEUE_GROUPS.map((g) => {
          const items = queue.filter((q) => q.state === g.state);
          return (
            <section key={g.state} className="card" data-testid={`queue-${g.state}`} aria-labelledby={`q-${g.state}`}>
              <h2 id={`q-${g.state}`} className="text-lead">
                {g.label} <span className="text-caption">({items.length})</span>
              </h2>
              <ul className="mt-2 divide-y divide-rule">
                {items.map((q) => (
                  <li key={q.roundId} className="py-2">
                    <Link className="font-semibold underline" to={href("/venues/:venueId/submissions/:submissionId/rounds/:round/desk", { venueId: venue.id, submissionId: q.submissionId, round: String(q.number) })}>
                      {q.title}
                    </Link>
                    <p className="text-caption">
                      Round {q.number} · flags: {q.mismatch} mismatch, {q.caution} caution, {q.note} note
                    </p>
                    <p className="text-caption text-basalt-soft">
                      Reviews: {q.invited} invited, {q.reviewing} in progress, {q.submitted} submitted
                      {q.decision ? ` · decision: ${decisionLabel(q.decision)}` : ""}
                    </p>
                  </li>
                ))}
              </ul>
            </section>
          );
        })}
      </div>
      <section className="card mt-8" aria-labelledby="policy-h">
        <h2 id="policy-h" className="text-lead scroll-mt-4">
          Checker policy of this venue
        </h2>
        <p className="mt-1 text-caption text-basalt-soft">
          Leave a field empty to use the default. The thresholds apply whenever a round of this venue is checked again; rounds already sent keep the flags they were sent with.
        </p>
        {actionData?.saved ? (
          <p role="status" className="mt-2 rounded bg-lichen-wash p-2">
            Policy saved.
          </p>
        ) : null}
        <Form method="post" className="mt-3 grid gap-3 md:grid-cols-3">
          <PolicyFields policy={venue.policy as Record<string, unknown>} errors={actionData?.fieldErrors} />
          <button type="submit" className="btn self-end">
            Save policy
          </button>
        </Form>
      </section>
    </main>
  );
}
